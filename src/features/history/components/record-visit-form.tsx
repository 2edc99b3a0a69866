import { toNestErrors } from '@hookform/resolvers';
import { zodResolver } from '@hookform/resolvers/zod';
import type { QueryKey } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState } from 'react';
import { useFieldArray, useForm, useWatch, type FieldError, type Path, type Resolver } from 'react-hook-form';
import type { z } from 'zod';
import {
  MAX_EVENTS_PER_VISIT,
  type RecordVisitInput,
  type RecordVisitResultDto,
  type VisitEventKind,
} from '../../../../shared/schemas/history';
import { visitPlausibilityIssues } from '../../../../shared/schemas/visit-rules';
import { Alert } from '../../../components/ui/alert';
import { Button, ButtonLink } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { newIdempotencyKey } from '../../../lib/idempotency-key';
import { isApiError } from '../../../lib/api-client';
import { useUnsentInput } from '../../../lib/unsent-input';
import { useRecordVisit } from '../api/record-visit';
import { enqueueVisit } from '../api/visit-queue';
import { ENTRY_KIND_LABELS, fmtDateTime, fmtKg } from '../utils/labels';
import { PRECEDENCE_NOTE } from '../utils/safety';
import { useUnitPrefs } from '../utils/unit-prefs';
import {
  emptyEntry,
  FIELDS_BY_KIND,
  toLocalInputValue,
  visitFormSchema,
  type VisitFormValues,
} from '../utils/visit-form-model';
import { AttachPhotos } from './attach-photos';
import { EntryCard } from './entry-card';
import { EntryGlyph } from './entry-glyph';
import { PreviewContext } from './form-controls';
import { PendingVisitsBanner } from './pending-visits-banner';
import { QueuedPhotos } from './queued-photos';

/** What the form needs to know about the unit; the route module gets it from the registry. */
export type VisitUnit = {
  id: number;
  containerNumber: string;
  refrigerant: string;
  nominalChargeKg: number;
  siteName?: string | null;
};

type Schema = ReturnType<typeof visitFormSchema>;
type FormInput = z.input<Schema>;
type FormOutput = z.output<Schema>;

/** Order of the "add" buttons: what a depot technician does most, first. */
const PALETTE: VisitEventKind[] = [
  'top_up',
  'leak_check',
  'repair',
  'pressure',
  'pti',
  'recovery',
  'recharge',
  'component_replacement',
  'status_change',
  'note',
];

// Friendlier words where the shared schema has none of its own (a schema's own message always wins).
const MISSING: Record<string, string> = {
  passed: 'Choose passed or failed',
  leakFound: 'Say whether a leak was found',
  status: 'Choose the new status',
  sightGlass: 'Choose what the sight glass showed',
  verified: 'Say whether the repair was verified',
};

function issuesToErrors(issues: Record<string, string>) {
  const flat: Record<string, FieldError> = {};
  for (const [path, message] of Object.entries(issues)) flat[path] = { type: 'plausibility', message };
  return flat;
}

type Outcome =
  | { state: 'editing' }
  | { state: 'saved'; result: RecordVisitResultDto }
  | { state: 'queued'; input: RecordVisitInput };

export function RecordVisitForm({
  unit,
  userId,
  unitHref,
  alsoInvalidate,
}: {
  unit: VisitUnit;
  userId: string;
  /** Back to the unit's page. */
  unitHref: string;
  /** Other features' keys a visit changes (the unit's record: a status change). */
  alsoInvalidate?: (unitId: number) => QueryKey[];
}) {
  const [prefs, setPrefs] = useUnitPrefs(userId);
  const [outcome, setOutcome] = useState<Outcome>({ state: 'editing' });
  const [formError, setFormError] = useState<{ title: string; message: string; canQueue: boolean } | null>(null);
  const recordVisit = useRecordVisit({ alsoInvalidate });
  const lastAttempt = useRef<{ json: string; key: string } | null>(null);
  const schema = useMemo(() => visitFormSchema(unit.id), [unit.id]);

  const resolver = useMemo<Resolver<FormInput, unknown, FormOutput>>(() => {
    const base = zodResolver(schema, {
      error: (iss) => {
        const last = iss.path?.at(-1);
        return iss.code === 'invalid_type' && typeof last === 'string' ? MISSING[last] : undefined;
      },
    });
    return async (values, context, options) => {
      const result = await base(values, context, options);
      if (Object.keys(result.errors).length > 0) {
        // The shared messages name the SI unit; say the unit the person is typing in.
        const list =
          (result.errors as { events?: Record<string, Record<string, FieldError | undefined>> }).events ?? {};
        values.events.forEach((d, i) => {
          const e = list[i];
          if (!e) return;
          if (d.massUnit === 'lb' && e.kg?.message) e.kg.message = e.kg.message.replace(' in kg', ' in lb');
          if (d.temperatureUnit === 'F') {
            for (const k of ['ambientC', 'supplyAirC', 'returnAirC'] as const) {
              const err = e[k];
              if (err?.message) err.message = err.message.replace('°C', '°F');
            }
          }
        });
        return result;
      }
      // The same plausibility rules the server applies, with this unit's charge and refrigerant.
      const issues = visitPlausibilityIssues(unit, result.values as FormOutput, new Date());
      if (Object.keys(issues).length === 0) return result;
      return { values: {}, errors: toNestErrors(issuesToErrors(issues), options) };
    };
  }, [schema, unit]);

  const form = useForm<FormInput, unknown, FormOutput>({
    resolver,
    defaultValues: { occurredAt: toLocalInputValue(new Date()), events: [] },
    shouldFocusError: true,
  });
  const { control, handleSubmit, setError, register, setValue, reset, formState } = form;
  const entries = useFieldArray({ control, name: 'events' });
  // A new version of the app waits while this form holds something not yet sent.
  useUnsentInput(outcome.state === 'editing' && (formState.isDirty || entries.fields.length > 0));
  const lastAdded = useRef<number | null>(null);

  // Live preview of the plausibility rules while typing (warnings until sent; the server refuses them).
  const watched = useWatch({ control }) as VisitFormValues;
  const preview = useMemo(() => {
    const parsed = schema.safeParse(watched);
    if (!parsed.success) return {};
    return visitPlausibilityIssues(unit, parsed.data, new Date());
  }, [watched, schema, unit]);

  useEffect(() => {
    if (lastAdded.current === null) return;
    const el = document.getElementById(`entry-${lastAdded.current}-title`);
    lastAdded.current = null;
    el?.closest('section')?.scrollIntoView({ behavior: 'smooth', block: 'start' });
  }, [entries.fields.length]);

  const addEntry = (kind: VisitEventKind) => {
    lastAdded.current = entries.fields.length;
    entries.append(emptyEntry(kind, prefs), { shouldFocus: false });
  };

  const queue = async (input: RecordVisitInput) => {
    try {
      await enqueueVisit(userId, input, unit.containerNumber);
    } catch {
      setFormError({
        title: 'The visit could not be kept on this phone',
        message:
          "The phone's storage is full or blocked. Keep this page open and try again when the connection is back.",
        canQueue: false,
      });
      return;
    }
    lastAttempt.current = null;
    setOutcome({ state: 'queued', input });
    window.scrollTo({ top: 0 });
  };

  const currentInput = useRef<RecordVisitInput | null>(null);

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    const json = JSON.stringify(values);
    // A retry of the very same visit keeps its key, so the server can tell it from a new one.
    const key = lastAttempt.current?.json === json ? lastAttempt.current.key : newIdempotencyKey();
    lastAttempt.current = { json, key };
    const input: RecordVisitInput = { ...values, idempotencyKey: key };
    currentInput.current = input;
    recordVisit.mutate(input, {
      onSuccess: (result) => {
        lastAttempt.current = null;
        setOutcome({ state: 'saved', result });
        window.scrollTo({ top: 0 });
      },
      onError: (error) => {
        if (!isApiError(error)) {
          setFormError({
            title: 'The visit was not saved',
            message: 'Something unexpected went wrong. Try again.',
            canQueue: false,
          });
          return;
        }
        if (error.status === 0) {
          void queue(input);
          return;
        }
        if (error.status >= 500) {
          setFormError({ title: 'The visit was not saved', message: error.message, canQueue: true });
          return;
        }
        const unplaced: string[] = [];
        let placed = 0;
        for (const [path, message] of Object.entries(error.fields ?? {})) {
          const m = /^events\.(\d+)\.(\w+)$/.exec(path);
          const draft = m ? values.events[Number(m[1])] : undefined;
          if (path === 'occurredAt') {
            setError('occurredAt', { type: 'server', message });
            placed++;
          } else if (m && draft && (FIELDS_BY_KIND[draft.kind] as readonly string[]).includes(m[2])) {
            setError(path as Path<FormInput>, { type: 'server', message }, { shouldFocus: placed === 0 });
            placed++;
          } else unplaced.push(message);
        }
        if (placed === 0 || unplaced.length > 0) {
          setFormError({
            title: 'The visit was not saved',
            message: unplaced.length > 0 ? unplaced.join(' ') : error.message,
            canQueue: false,
          });
        }
      },
    });
  });

  const startOver = () => {
    reset({ occurredAt: toLocalInputValue(new Date()), events: [] });
    setFormError(null);
    setOutcome({ state: 'editing' });
    window.scrollTo({ top: 0 });
  };

  const banner = <PendingVisitsBanner userId={userId} alsoInvalidate={alsoInvalidate} />;

  if (outcome.state === 'saved') {
    return (
      <div className="flex max-w-3xl flex-col gap-5">
        {banner}
        <VisitSaved unitId={unit.id} result={outcome.result} />
        <div className="flex flex-col gap-3 sm:flex-row">
          <ButtonLink to={unitHref} size="lg">
            Back to {unit.containerNumber}
          </ButtonLink>
          <Button variant="secondary" size="lg" onClick={startOver}>
            Record another visit
          </Button>
        </div>
      </div>
    );
  }

  if (outcome.state === 'queued') {
    return (
      <div className="flex max-w-3xl flex-col gap-5">
        <Alert tone="info" title="Kept on this phone: no connection right now">
          The visit of {fmtDateTime(outcome.input.occurredAt)} ({outcome.input.events.length}{' '}
          {outcome.input.events.length === 1 ? 'entry' : 'entries'}) is saved here, also if the browser is closed, and
          goes out by itself once the phone is back online. Sending it twice is not possible: the server knows it by its
          key. Photos added below wait with it and go up right after it.
        </Alert>
        {banner}
        <h2 className="text-xl font-bold">Photos</h2>
        <QueuedPhotos userId={userId} input={outcome.input} />
        <div className="flex flex-col gap-3 sm:flex-row">
          <ButtonLink to={unitHref} size="lg">
            Back to {unit.containerNumber}
          </ButtonLink>
          <Button variant="secondary" size="lg" onClick={startOver}>
            Record another visit
          </Button>
        </div>
      </div>
    );
  }

  const arrayError = formState.errors.events?.root?.message ?? formState.errors.events?.message;
  const count = entries.fields.length;

  return (
    <PreviewContext.Provider value={preview}>
      <form onSubmit={onSubmit} noValidate aria-label="Record a visit" className="flex max-w-3xl flex-col gap-6">
        {banner}
        {formError && (
          <Alert tone="alarm" title={formError.title}>
            <p>{formError.message}</p>
            {formError.canQueue && currentInput.current && (
              <div className="mt-3 flex flex-wrap gap-2">
                <Button type="submit" variant="secondary">
                  Try again
                </Button>
                <Button variant="quiet" onClick={() => currentInput.current && void queue(currentInput.current)}>
                  Keep it on this phone and send later
                </Button>
              </div>
            )}
          </Alert>
        )}

        <WhenField
          register={register}
          error={formState.errors.occurredAt?.message ?? preview.occurredAt}
          onNow={() => setValue('occurredAt', toLocalInputValue(new Date()), { shouldValidate: formState.isSubmitted })}
        />

        {count > 0 && (
          <div className="flex flex-col gap-4">
            <h2 className="text-xl font-bold">
              In this visit <span className="font-normal text-ink-600">({count})</span>
            </h2>
            {entries.fields.map((f, i) => (
              <EntryCard
                key={f.id}
                control={control}
                index={i}
                kind={f.kind}
                refrigerant={unit.refrigerant}
                onUnitsChange={setPrefs}
                onRemove={() => entries.remove(i)}
              />
            ))}
          </div>
        )}

        <section aria-labelledby="add-entry-title" className="flex flex-col gap-3">
          <h2 id="add-entry-title" className="text-xl font-bold">
            {count === 0 ? 'What did you do?' : 'Add more to this visit'}
          </h2>
          {count === 0 && (
            <p className="text-ink-600">Tap everything done at this visit; each becomes an entry to fill in.</p>
          )}
          <div className="grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-5">
            {PALETTE.map((kind) => (
              <button
                key={kind}
                type="button"
                disabled={count >= MAX_EVENTS_PER_VISIT}
                onClick={() => addEntry(kind)}
                className={cx(
                  'flex min-h-touch-lg items-center gap-2 rounded-md border-2 border-ink-950 bg-white px-3 py-2 text-left font-semibold',
                  'hover:bg-fjord-50 active:bg-fjord-100 disabled:opacity-50',
                )}
              >
                <EntryGlyph kind={kind} className="size-8" />
                <span className="leading-tight">
                  <span className="sr-only">Add </span>
                  {ENTRY_KIND_LABELS[kind]}
                </span>
              </button>
            ))}
          </div>
          {arrayError && (
            <p role="alert" className="text-sm font-semibold text-alarm-700">
              {arrayError}
            </p>
          )}
        </section>

        <p className="text-sm text-ink-600">
          {unit.containerNumber} · {unit.refrigerant} · full charge {fmtKg(unit.nominalChargeKg)}
          {unit.siteName ? ` · recorded at ${unit.siteName}` : ''}. {PRECEDENCE_NOTE}
        </p>

        <div className="sticky bottom-[calc(var(--spacing-tabbar)+env(safe-area-inset-bottom)+0.5rem)] z-10 md:bottom-4">
          <Button
            type="submit"
            size="lg"
            className="w-full shadow-lifted"
            pending={recordVisit.isPending}
            pendingLabel="Saving…"
          >
            {count === 0 ? 'Save visit' : `Save visit (${count} ${count === 1 ? 'entry' : 'entries'})`}
          </Button>
        </div>
      </form>
    </PreviewContext.Provider>
  );
}

function WhenField({
  register,
  error,
  onNow,
}: {
  register: ReturnType<typeof useForm<FormInput, unknown, FormOutput>>['register'];
  error?: string;
  onNow: () => void;
}) {
  const max = toLocalInputValue(new Date());
  return (
    <div className="flex flex-col gap-1.5">
      <label htmlFor="visit-when" className="text-base font-semibold">
        When the work was done
      </label>
      <p id="visit-when-hint" className="text-sm text-ink-600">
        Now, unless you are recording it afterwards. The time it is entered is kept as well.
      </p>
      <div className="flex gap-2">
        <input
          id="visit-when"
          type="datetime-local"
          max={max}
          aria-invalid={error ? true : undefined}
          aria-describedby={cx('visit-when-hint', error && 'visit-when-error')}
          className={cx(
            'block min-h-touch-lg w-full min-w-0 flex-1 rounded-md border-2 bg-white px-3 text-lg tabular-nums',
            error ? 'border-alarm-700' : 'border-ink-400',
          )}
          {...register('occurredAt')}
        />
        <Button variant="secondary" onClick={onNow} className="min-h-touch-lg shrink-0">
          Now
        </Button>
      </div>
      {error && (
        <p id="visit-when-error" className="text-sm font-semibold text-alarm-700">
          {error}
        </p>
      )}
    </div>
  );
}

/** After saving: what went in, and a place to add photos to each entry. */
function VisitSaved({ unitId, result }: { unitId: number; result: RecordVisitResultDto }) {
  return (
    <div className="flex flex-col gap-4">
      <Alert tone="okay" title={result.replayed ? 'This visit was already saved' : 'Visit saved'}>
        {result.replayed
          ? 'It had reached Tightloop before; nothing was saved twice.'
          : `${result.events.length} ${result.events.length === 1 ? 'entry' : 'entries'} recorded. The unit's figures are up to date.`}
      </Alert>
      <h2 className="text-xl font-bold">Photos</h2>
      <p className="-mt-2 text-ink-600">
        Optional: a photo of the leak, the gauge or the cylinder label. Photos and PDF documents.
      </p>
      <ul className="flex flex-col gap-3">
        {[...result.events]
          .sort((a, b) => a.id - b.id)
          .map((e) => (
            <li key={e.id} className="flex flex-col gap-3 rounded-lg border-2 border-ink-200 bg-white p-4">
              <div className="flex items-center gap-3">
                <EntryGlyph kind={e.kind} className="size-8" />
                <p className="font-semibold">
                  {ENTRY_KIND_LABELS[e.kind as VisitEventKind] ?? e.kind}
                  {e.kg != null && <span className="font-normal text-ink-600"> · {fmtKg(e.kg)}</span>}
                </p>
              </div>
              <AttachPhotos
                unitId={unitId}
                eventId={e.id}
                label={ENTRY_KIND_LABELS[e.kind as VisitEventKind] ?? e.kind}
                existing={e.attachments.length}
              />
            </li>
          ))}
      </ul>
    </div>
  );
}
