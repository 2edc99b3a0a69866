import type { QueryKey } from '@tanstack/react-query';
import type { MutableRefObject } from 'react';
import type { VisitEventKind, VisitSubmission } from '../../../../shared/schemas/history';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { PRECEDENCE } from '../../../components/ui/caution';
import { cx } from '../../../components/ui/cx';
import { useRecordVisitForm, type VisitFormError } from '../hooks/use-record-visit-form';
import type { VisitUnit } from '../hooks/use-visit-resolver';
import { toLocalInputValue } from '../utils/visit-form-model';
import { EntryCard, type CylinderSlot } from './entry-card';
import { PreviewContext } from './form-controls';
import { PendingVisitsBanner } from './pending-visits-banner';
import { EntryPalette } from './record-visit/entry-palette';
import { OutcomeActions, VisitQueued, VisitSaved } from './record-visit/visit-outcome';
import { WhenField } from './record-visit/when-field';
import { fmtKg } from '../../../lib/format';

export type { VisitUnit } from '../hooks/use-visit-resolver';

/** Why the visit did not go; for a server that failed, send again or keep it on the phone. */
function FormErrorAlert({
  error,
  currentInput,
  onQueue,
}: {
  error: VisitFormError;
  currentInput: MutableRefObject<VisitSubmission | null>;
  onQueue: (input: VisitSubmission) => void;
}) {
  return (
    <Alert tone="alarm" title={error.title}>
      <p>{error.message}</p>
      {error.canQueue && currentInput.current && (
        <div className="mt-3 flex flex-wrap gap-2">
          <Button type="submit" variant="secondary">
            Try again
          </Button>
          <Button variant="quiet" onClick={() => currentInput.current && onQueue(currentInput.current)}>
            Keep it on this phone and send later
          </Button>
        </div>
      )}
    </Alert>
  );
}

function UnitLine({ unit }: { unit: VisitUnit }) {
  if (unit.qrToken) {
    return (
      <p className="text-sm text-ink-600">
        {unit.containerNumber}: this phone does not know the unit yet. The visit goes to the label&rsquo;s unit when it
        is sent; check the refrigerant and full charge on the unit&rsquo;s data plate. {PRECEDENCE}
      </p>
    );
  }
  return (
    <p className="text-sm text-ink-600">
      {unit.containerNumber} · {unit.refrigerant} · full charge {fmtKg(unit.nominalChargeKg)}
      {unit.siteName ? ` · recorded at ${unit.siteName}` : ''}. {PRECEDENCE}
    </p>
  );
}

const REFRIGERANT_KINDS = new Set<VisitEventKind>(['top_up', 'recovery', 'recharge']);

function SaveBar({ count, saving }: { count: number; saving: boolean }) {
  return (
    // On phones it rests on the tab bar at 48 px (still a gloved thumb's target), so the two cover ~14 % of the screen;
    // with nothing entered yet it waits at the end of the form instead of covering the entry buttons.
    <div
      className={cx(
        count > 0 && 'sticky bottom-[calc(var(--spacing-tabbar)+env(safe-area-inset-bottom))] z-10 md:bottom-4',
      )}
    >
      <Button
        type="submit"
        className="w-full shadow-lifted md:min-h-touch-lg md:px-6 md:text-lg"
        pending={saving}
        pendingLabel="Saving…"
      >
        {count === 0 ? 'Save visit' : `Save visit (${count} ${count === 1 ? 'entry' : 'entries'})`}
      </Button>
    </div>
  );
}

export function RecordVisitForm({
  unit,
  userId,
  unitHref,
  alsoInvalidate,
  cylinderSlot,
  initialEntry,
  certificateWarning,
}: {
  /** Said (not enforced) on entries that handle refrigerant, e.g. when the recorder's certificate has expired. */
  certificateWarning?: string | null;
  unit: VisitUnit;
  /** The entry the form opens with, e.g. from `?entry=pressure`. */
  initialEntry?: VisitEventKind | null;
  /** The cylinder picker for charges and recoveries, from the page (see EntryCard). */
  cylinderSlot?: CylinderSlot;
  userId: string;
  /** Back to the unit's page. */
  unitHref: string;
  /** Other features' keys a visit changes (the unit's record: a status change). */
  alsoInvalidate?: (unitId: number) => QueryKey[];
}) {
  const v = useRecordVisitForm({ unit, userId, alsoInvalidate, initialEntry });
  const { control, register, setValue, formState } = v.form;
  const banner = <PendingVisitsBanner userId={userId} alsoInvalidate={alsoInvalidate} />;
  const actions = (
    <OutcomeActions unitHref={unitHref} containerNumber={unit.containerNumber} onStartOver={v.startOver} />
  );

  if (v.outcome.state === 'saved') {
    return (
      <div className="flex max-w-3xl flex-col gap-5">
        {banner}
        <VisitSaved unitId={v.outcome.result.events[0]?.unitId ?? unit.id} result={v.outcome.result} />
        {actions}
      </div>
    );
  }
  if (v.outcome.state === 'queued') {
    return (
      <div className="flex max-w-3xl flex-col gap-5">
        <VisitQueued userId={userId} input={v.outcome.input} banner={banner} />
        {actions}
      </div>
    );
  }

  const arrayError = formState.errors.events?.root?.message ?? formState.errors.events?.message;
  const count = v.entries.fields.length;
  return (
    <PreviewContext.Provider value={v.preview}>
      <form onSubmit={v.onSubmit} noValidate aria-label="Record a visit" className="flex max-w-3xl flex-col gap-6">
        {banner}
        {v.formError && (
          <FormErrorAlert error={v.formError} currentInput={v.currentInput} onQueue={(i) => void v.queue(i)} />
        )}
        <WhenField
          register={register}
          error={formState.errors.occurredAt?.message ?? v.preview.occurredAt}
          onNow={() => setValue('occurredAt', toLocalInputValue(new Date()), { shouldValidate: formState.isSubmitted })}
        />
        {count > 0 && (
          <div className="flex flex-col gap-4">
            <h2 className="text-xl font-bold">
              In this visit <span className="font-normal text-ink-600">({count})</span>
            </h2>
            {v.entries.fields.map((f, i) => (
              <EntryCard
                key={f.id}
                control={control}
                index={i}
                kind={f.kind}
                refrigerant={unit.refrigerant}
                cylinderSlot={cylinderSlot}
                onUnitsChange={v.setPrefs}
                onRemove={() => v.entries.remove(i)}
              />
            ))}
          </div>
        )}
        {certificateWarning && v.entries.fields.some((f) => REFRIGERANT_KINDS.has(f.kind)) && (
          <Alert tone="heed" title="Your refrigerant certificate">
            {certificateWarning}
          </Alert>
        )}
        <EntryPalette count={count} error={arrayError} onAdd={v.addEntry} />
        <UnitLine unit={unit} />
        <SaveBar count={count} saving={v.saving} />
      </form>
    </PreviewContext.Provider>
  );
}
