import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo, useState } from 'react';
import { useForm, type FieldErrors } from 'react-hook-form';
import { z } from 'zod';
import { compareRepairOptions, type RepairOptionsResult } from '../../../../shared/domain';
import {
  DECISION_CHOICES,
  DECISION_OPTION,
  decisionInputsSchema,
  economicsSchema,
  type DecisionChoice,
  type UnitDecisionDto,
} from '../../../../shared/schemas/decisions';
import { DEFAULT_SETTINGS } from '../../../../shared/schemas/settings';
import { useRecordDecision } from '../api/record-decision';

const formSchema = z.object({
  economics: economicsSchema,
  inputs: decisionInputsSchema,
  choice: z.enum(DECISION_CHOICES),
  note: z.string().trim().max(2000).optional(),
});
export type DecisionFormValues = z.infer<typeof formSchema>;
export type DecisionFormInput = z.input<typeof formSchema>;

const round = (v: number | null, d: number) => (v === null ? null : Math.round(v * 10 ** d) / 10 ** d);

const choiceOf = (id: RepairOptionsResult['cheapestId']): DecisionChoice =>
  (Object.entries(DECISION_OPTION).find(([, o]) => o === id)?.[0] as DecisionChoice) ?? 'keep';

export function errorAt(errors: FieldErrors<DecisionFormInput>, path: string): string | undefined {
  let node: unknown = errors;
  for (const k of path.split('.')) node = (node as Record<string, unknown> | undefined)?.[k];
  return (node as { message?: string } | undefined)?.message;
}

/**
 * The decision form: assumptions that reprice the options in the browser with the same engine as the server on every
 * keystroke, and the choice recorded with a key that a retry keeps.
 */
export function useDecisionForm(data: UnitDecisionDto, keyFor: () => string) {
  const record = useRecordDecision(data.unit.id);
  const [key, setKey] = useState(keyFor);
  const form = useForm<DecisionFormInput, unknown, DecisionFormValues>({
    resolver: zodResolver(formSchema),
    mode: 'onChange',
    defaultValues: {
      economics: data.economics,
      inputs: {
        // Shown rounded (days to 0.1, kg to grams); the server prices exactly what is submitted.
        topUpIntervalDays: round(data.engineInput.topUpIntervalDays, 1),
        madeUpKgPerVisit: round(data.engineInput.madeUpKgPerVisit, 3),
        leakLocation: data.engineInput.leakLocation ?? 'other',
      },
      choice: choiceOf(data.result.cheapestId),
      note: '',
    },
  });
  const values = form.watch();

  // A half-typed field falls back to the saved settings' figures.
  const live = useMemo(() => {
    const e = economicsSchema.safeParse(values.economics);
    const i = decisionInputsSchema.safeParse(values.inputs);
    if (!e.success || !i.success) return null;
    try {
      return compareRepairOptions({ ...data.engineInput, ...i.data }, { ...DEFAULT_SETTINGS, economics: e.data });
    } catch {
      return null;
    }
  }, [JSON.stringify(values.economics), JSON.stringify(values.inputs), data.engineInput]); // eslint-disable-line react-hooks/exhaustive-deps

  const onSubmit = form.handleSubmit((v) =>
    record.mutate(
      { choice: v.choice, economics: v.economics, inputs: v.inputs, note: v.note || undefined, idempotencyKey: key },
      { onSuccess: () => setKey(keyFor()) },
    ),
  );

  return {
    form,
    live,
    result: live ?? data.result,
    location: values.inputs?.leakLocation ?? 'other',
    record,
    onSubmit,
  };
}
