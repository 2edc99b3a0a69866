import type { ReactNode } from 'react';
import type { UseFormRegister, UseFormRegisterReturn } from 'react-hook-form';
import { REFRIGERANTS } from '../../../../shared/domain';
import type { SiteDto } from '../../../../shared/schemas/sites';
import { MAX_NOTES_LENGTH, UNIT_STATUS_LABELS, UNIT_STATUSES, type UnitDto } from '../../../../shared/schemas/units';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { SelectField, TextField } from '../../../components/ui/field';
import { useUnitForm, type Field, type FormInput } from '../hooks/use-unit-form';
import { ContainerNumberField } from '../../../components/ui/container-number-field';

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <fieldset className="flex flex-col gap-5 border-t-2 border-ink-200 pt-5">
      <legend className="pr-3 text-lg font-bold">{title}</legend>
      {children}
    </fieldset>
  );
}

/** The refrigerant and its full charge, and what identifies the machinery. */
function MachineryFields({
  register,
  error,
}: {
  register: UseFormRegister<FormInput>;
  error: (field: Field) => string | undefined;
}) {
  return (
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
  const { form, formError, onSubmit, error, pending } = useUnitForm({ unit, defaultContainerNumber, onSaved });
  const { register, watch } = form;

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

      <MachineryFields register={register} error={error} />

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
