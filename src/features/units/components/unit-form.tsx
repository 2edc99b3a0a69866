import { zodResolver } from '@hookform/resolvers/zod';
import { useState, type ReactNode } from 'react';
import { useForm, type Path, type UseFormRegisterReturn } from 'react-hook-form';
import type { z } from 'zod';
import { formatContainerNumber, REFRIGERANTS } from '../../../../shared/domain';
import type { SiteDto } from '../../../../shared/schemas/sites';
import {
  createUnitSchema,
  MAX_NOTES_LENGTH,
  UNIT_STATUS_LABELS,
  UNIT_STATUSES,
  type UnitDto,
  type UpdateUnitInput,
} from '../../../../shared/schemas/units';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { SelectField, TextField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';
import { useCreateUnit } from '../api/create-unit';
import { useUpdateUnit } from '../api/update-unit';
import { ContainerNumberField } from '../../../components/ui/container-number-field';

type FormInput = z.input<typeof createUnitSchema>;
type FormOutput = z.output<typeof createUnitSchema>;

const FIELDS = [
  'containerNumber',
  'refrigerant',
  'nominalChargeKg',
  'commissionedOn',
  'siteId',
  'status',
  'machinerySerial',
  'model',
  'manufactureYear',
  'purchaseCost',
  'residualValue',
  'notes',
] as const satisfies readonly Path<FormInput>[];
type Field = (typeof FIELDS)[number];
const isField = (key: string): key is Field => (FIELDS as readonly string[]).includes(key);

const text = (v: string | number | null | undefined) => (v === null || v === undefined ? '' : String(v));

function defaultsOf(unit: UnitDto | undefined, containerNumber: string): FormInput {
  return {
    containerNumber: unit ? formatContainerNumber(unit.containerNumber) : containerNumber,
    refrigerant: unit?.refrigerant ?? '',
    nominalChargeKg: text(unit?.nominalChargeKg),
    commissionedOn: unit?.commissionedOn ?? '',
    siteId: text(unit?.site?.id),
    status: unit?.status ?? 'in_service',
    machinerySerial: unit?.machinerySerial ?? '',
    model: unit?.model ?? '',
    manufactureYear: text(unit?.manufactureYear),
    purchaseCost: text(unit?.purchaseCost),
    residualValue: text(unit?.residualValue),
    notes: unit?.notes ?? '',
  };
}

/** Only what differs from the unit as saved, so the change history records real changes. */
function changesOf(unit: UnitDto, values: FormOutput): UpdateUnitInput {
  const current: Record<Field, unknown> = { ...unit, siteId: unit.site?.id ?? null };
  const changes: Record<string, unknown> = {};
  for (const field of FIELDS) {
    const next = values[field] ?? null;
    if (next !== (current[field] ?? null)) changes[field] = next;
  }
  return changes as UpdateUnitInput;
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <fieldset className="flex flex-col gap-5 border-t-2 border-ink-200 pt-5">
      <legend className="pr-3 text-lg font-bold">{title}</legend>
      {children}
    </fieldset>
  );
}

export function UnitForm({
  unit,
  sites,
  defaultContainerNumber = '',
  onSaved,
  onCancel,
}: {
  /** The unit to edit; absent when registering a new one. */
  unit?: UnitDto;
  sites: SiteDto[];
  defaultContainerNumber?: string;
  onSaved: (unit: UnitDto) => void;
  onCancel: () => void;
}) {
  const createUnit = useCreateUnit();
  const updateUnit = useUpdateUnit();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    setFocus,
    watch,
    formState: { errors },
  } = useForm<FormInput, unknown, FormOutput>({
    resolver: zodResolver(createUnitSchema),
    defaultValues: defaultsOf(unit, defaultContainerNumber),
  });
  const pending = createUnit.isPending || updateUnit.isPending;

  const onError = (error: unknown) => {
    if (!isApiError(error)) {
      setFormError('Something unexpected went wrong. Try again.');
      return;
    }
    let first: Field | null = null;
    const unplaced: string[] = [];
    for (const [field, message] of Object.entries(error.fields ?? {})) {
      if (isField(field)) {
        setError(field, { type: 'server', message });
        first ??= field;
      } else unplaced.push(message);
    }
    if (first) setFocus(first);
    if (!first || unplaced.length > 0) setFormError(error.message);
  };

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    if (!unit) {
      createUnit.mutate(values, { onSuccess: onSaved, onError });
      return;
    }
    const changes = changesOf(unit, values);
    if (Object.keys(changes).length === 0) {
      onSaved(unit);
      return;
    }
    updateUnit.mutate({ id: unit.id, changes }, { onSuccess: onSaved, onError });
  });

  const error = (field: Field) => errors[field]?.message as string | undefined;

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="flex flex-col gap-6"
      aria-label={unit ? 'Edit unit' : 'Register a unit'}
    >
      {formError && (
        <Alert tone="alarm" title={unit ? 'The changes were not saved' : 'The unit was not registered'}>
          {formError}
        </Alert>
      )}

      <Section title="Identity">
        <ContainerNumberField
          label="Container number"
          value={String(watch('containerNumber') ?? '')}
          error={error('containerNumber')}
          placeholder="HRLU 100001 6"
          {...register('containerNumber')}
        />
        <div className="grid gap-5 md:grid-cols-2">
          <SelectField label="Site" optional error={error('siteId')} {...register('siteId')}>
            <option value="">No site yet</option>
            {sites.map((s) => (
              <option key={s.id} value={s.id}>
                {s.code} · {s.name}
              </option>
            ))}
          </SelectField>
          <SelectField label="Status" error={error('status')} {...register('status')}>
            {UNIT_STATUSES.map((s) => (
              <option key={s} value={s}>
                {UNIT_STATUS_LABELS[s]}
              </option>
            ))}
          </SelectField>
        </div>
      </Section>

      <Section title="Refrigeration machinery">
        <div className="grid gap-5 md:grid-cols-2">
          <SelectField label="Refrigerant" error={error('refrigerant')} {...register('refrigerant')}>
            <option value="" disabled>
              Choose the refrigerant…
            </option>
            {REFRIGERANTS.map((r) => (
              <option key={r.code} value={r.code}>
                {r.code}
                {r.flammable ? ` — ${r.safetyClass}, flammable` : ''}
                {r.highPressure ? ' — high pressure' : ''}
              </option>
            ))}
          </SelectField>
          <TextField
            label="Full charge (kg)"
            hint="The nameplate charge, in kilograms."
            inputMode="decimal"
            autoComplete="off"
            error={error('nominalChargeKg')}
            {...register('nominalChargeKg')}
          />
          <TextField
            label="Commissioned on"
            type="date"
            optional
            error={error('commissionedOn')}
            {...register('commissionedOn')}
          />
          <TextField
            label="Year of manufacture"
            inputMode="numeric"
            optional
            error={error('manufactureYear')}
            {...register('manufactureYear')}
          />
          <TextField label="Model" optional autoComplete="off" error={error('model')} {...register('model')} />
          <TextField
            label="Machinery serial"
            optional
            autoComplete="off"
            spellCheck={false}
            error={error('machinerySerial')}
            {...register('machinerySerial')}
          />
        </div>
      </Section>

      <Section title="Value">
        <div className="grid gap-5 md:grid-cols-2">
          <TextField
            label="Purchase cost"
            inputMode="decimal"
            optional
            hint="In the fleet's accounting currency."
            error={error('purchaseCost')}
            {...register('purchaseCost')}
          />
          <TextField
            label="Residual value"
            inputMode="decimal"
            optional
            hint="What the unit would fetch if sold today."
            error={error('residualValue')}
            {...register('residualValue')}
          />
        </div>
        <Notes error={error('notes')} registration={register('notes')} />
      </Section>

      <div className="flex flex-col-reverse gap-3 sm:flex-row">
        <Button variant="secondary" size="lg" onClick={onCancel} className="sm:min-w-36">
          Cancel
        </Button>
        <Button type="submit" size="lg" pending={pending} pendingLabel="Saving…" className="sm:min-w-48">
          {unit ? 'Save changes' : 'Register unit'}
        </Button>
      </div>
    </form>
  );
}

function Notes({ error, registration }: { error?: string; registration: UseFormRegisterReturn }) {
  return (
    <div className="flex flex-col gap-1.5">
      <label htmlFor="unit-notes" className="text-base font-semibold">
        Notes <span className="ml-2 text-sm font-normal text-ink-600">(optional)</span>
      </label>
      <textarea
        id="unit-notes"
        rows={3}
        maxLength={MAX_NOTES_LENGTH}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? 'unit-notes-error' : undefined}
        className={cx(
          'block w-full rounded-md border-2 bg-white px-3 py-2 text-base',
          error ? 'border-alarm-700' : 'border-ink-400',
        )}
        {...registration}
      />
      {error && (
        <p id="unit-notes-error" className="text-sm font-semibold text-alarm-700">
          {error}
        </p>
      )}
    </div>
  );
}
