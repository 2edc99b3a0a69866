import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm, type Path } from 'react-hook-form';
import type { z } from 'zod';
import { formatContainerNumber } from '../../../../shared/domain';
import {
  createUnitSchema,
  UNIT_INPUT_FIELDS,
  type UnitDto,
  type UpdateUnitInput,
} from '../../../../shared/schemas/units';
import { isApiError } from '../../../lib/api-client';
import { placeFieldErrors } from '../../../lib/form-errors';
import { useCreateUnit } from '../api/create-unit';
import { useUpdateUnit } from '../api/update-unit';

export type FormInput = z.input<typeof createUnitSchema>;
export type FormOutput = z.output<typeof createUnitSchema>;

const FIELDS = UNIT_INPUT_FIELDS satisfies readonly Path<FormInput>[];
export type Field = (typeof FIELDS)[number];

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

/**
 * The unit form's submission: registers a new unit or saves only what changed, and puts the server's field errors on
 * the fields (focusing the first); what no field shows goes in the form's alert.
 */
export function useUnitForm({
  unit,
  defaultContainerNumber,
  onSaved,
}: {
  unit?: UnitDto;
  defaultContainerNumber: string;
  onSaved: (unit: UnitDto) => void;
}) {
  const createUnit = useCreateUnit();
  const updateUnit = useUpdateUnit();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<FormInput, unknown, FormOutput>({
    resolver: zodResolver(createUnitSchema),
    defaultValues: defaultsOf(unit, defaultContainerNumber),
  });
  const { handleSubmit, setError, setFocus } = form;

  const onError = (error: unknown) => {
    if (!isApiError(error)) {
      setFormError('Something unexpected went wrong. Try again.');
      return;
    }
    const { placed, unplaced } = placeFieldErrors(error, FIELDS, { setError, setFocus });
    if (!placed || unplaced.length > 0) setFormError(error.message);
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

  const error = (field: Field) => form.formState.errors[field]?.message as string | undefined;
  return { form, formError, onSubmit, error, pending: createUnit.isPending || updateUnit.isPending };
}
