// Repair-or-retire decisions (DOMAIN.md §9): the options of one unit, the fleet's candidates, recording a decision.
import { z } from 'zod';
import { LEAK_LOCATION_IDS, type EconomicOptionId, type RepairOptionsInput, type RepairOptionsResult } from '../domain';
import { settingsSchema, type Settings } from './settings';

export const DECISION_CHOICES = ['keep', 'repair', 're_machine', 'retire'] as const;
export type DecisionChoice = (typeof DECISION_CHOICES)[number];

export const DECISION_CHOICE_LABELS: Record<DecisionChoice, string> = {
  keep: 'Keep topping up',
  repair: 'Repair the leak',
  re_machine: 'Fit new machinery',
  retire: 'Retire and sell',
};

/** Which priced option each decision follows. */
export const DECISION_OPTION: Record<DecisionChoice, EconomicOptionId> = {
  keep: 'keep_topping_up',
  repair: 'repair',
  re_machine: 'new_machinery',
  retire: 'retire_and_sell',
};

export const economicsSchema = settingsSchema.shape.economics.unwrap();
export type EconomicsSettings = Settings['economics'];

/** The unit's own figures the comparison rests on; editable on the page like the prices. */
export const decisionInputsSchema = z.object({
  topUpIntervalDays: z.number().positive('Days between top-ups must be more than 0').max(36500).nullable(),
  madeUpKgPerVisit: z.number().min(0, 'The kg per top-up cannot be negative').max(1000).nullable(),
  leakLocation: z.enum(LEAK_LOCATION_IDS, { message: 'Choose where the leak is' }),
});
export type DecisionInputs = z.infer<typeof decisionInputsSchema>;

export const recordDecisionSchema = z.object({
  choice: z.enum(DECISION_CHOICES, { message: 'Choose keep, repair, re-machine or retire' }),
  economics: economicsSchema,
  inputs: decisionInputsSchema,
  note: z.string().trim().max(2000).optional(),
  idempotencyKey: z
    .string()
    .min(8)
    .max(64)
    .regex(/^[\w-]+$/, 'Bad idempotency key'),
});
export type RecordDecisionInput = z.infer<typeof recordDecisionSchema>;
export type RecordDecisionBody = z.input<typeof recordDecisionSchema>;

/** A recorded decision's entry details as screens and the handover read them back (an older record may lack parts). */
export type StoredDecisionDetails = {
  choice?: DecisionChoice;
  option?: string;
  cheapestId?: string;
  currency?: string;
  options?: { id: string; label: string; npv: number; eac: number; cheapest?: boolean }[];
  assumptions?: Record<string, unknown>;
  settingsVersion?: number;
};

const economicOptionId = z.enum(['keep_topping_up', 'repair', 'new_machinery', 'retire_and_sell']);

export const decisionRecordDto = z.object({
  eventId: z.number(),
  choice: z.enum(DECISION_CHOICES),
  at: z.string(),
  by: z.object({ id: z.string(), name: z.string() }),
  cheapestId: economicOptionId,
  note: z.string().nullable(),
});
export type DecisionRecordDto = z.infer<typeof decisionRecordDto>;

export const unitDecisionDto = z.object({
  asOf: z.string(),
  unit: z.object({
    id: z.number(),
    containerNumber: z.string(),
    refrigerant: z.string(),
    nominalChargeKg: z.number(),
    commissionedOn: z.string().nullable(),
    status: z.string(),
    site: z.object({ id: z.number(), name: z.string() }).nullable(),
  }),
  stats: z
    .object({
      score: z.number(),
      scoreBand: z.string(),
      rollingLeakRatePct: z.number(),
      forecastDate: z.string().nullable(),
    })
    .nullable(),
  /** Everything compareRepairOptions needs, so the browser recomputes the same figures live. */
  engineInput: z.custom<RepairOptionsInput>(),
  economics: z.custom<EconomicsSettings>(),
  result: z.custom<RepairOptionsResult>(),
  /** Where the default leak location and the recurrence came from. */
  sources: z.object({
    leakLocation: z.enum(['open_leak', 'last_leak_found', 'last_repair', 'none']),
    interval: z.enum(['forecast', 'no_leak_evidence']),
  }),
  decisions: z.array(decisionRecordDto),
});
export type UnitDecisionDto = z.infer<typeof unitDecisionDto>;

export const candidatesQuerySchema = z.object({
  siteId: z.coerce.number().int().positive().max(2_147_483_647).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});

export const retirementCandidateDto = z.object({
  unitId: z.number(),
  containerNumber: z.string(),
  site: z.string().nullable(),
  refrigerant: z.string(),
  score: z.number(),
  scoreBand: z.string(),
  rollingLeakRatePct: z.number(),
  ageYears: z.number(),
  keepEac: z.number(),
  cheapestId: economicOptionId,
  cheapestEac: z.number(),
  retireEac: z.number(),
  /** keep-topping-up EAC − cheapest EAC, per year. */
  yearlySaving: z.number(),
  /** keep-topping-up EAC − retire EAC, per year (negative: retiring costs more). */
  retireSaving: z.number(),
});
export type RetirementCandidateDto = z.infer<typeof retirementCandidateDto>;

export const retirementCandidatesDto = z.object({
  asOf: z.string(),
  currency: z.string(),
  /** How many of the highest-scoring units were priced. */
  considered: z.number(),
  candidates: z.array(retirementCandidateDto),
});
export type RetirementCandidatesDto = z.infer<typeof retirementCandidatesDto>;

/** A decision just recorded (201), or the one this submission key recorded before (200, replayed). */
export const recordDecisionResultDto = z.object({ decision: decisionRecordDto, replayed: z.boolean() });
export type RecordDecisionResultDto = z.infer<typeof recordDecisionResultDto>;
