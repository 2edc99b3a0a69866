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

export type DecisionRecordDto = {
  eventId: number;
  choice: DecisionChoice;
  at: string;
  by: { id: string; name: string };
  cheapestId: EconomicOptionId;
  note: string | null;
};

export type UnitDecisionDto = {
  asOf: string;
  unit: {
    id: number;
    containerNumber: string;
    refrigerant: string;
    nominalChargeKg: number;
    commissionedOn: string | null;
    status: string;
    site: { id: number; name: string } | null;
  };
  stats: { score: number; scoreBand: string; rollingLeakRatePct: number; forecastDate: string | null } | null;
  /** Everything compareRepairOptions needs, so the browser recomputes the same figures live. */
  engineInput: RepairOptionsInput;
  economics: EconomicsSettings;
  result: RepairOptionsResult;
  /** Where the default leak location and the recurrence came from. */
  sources: {
    leakLocation: 'open_leak' | 'last_leak_found' | 'last_repair' | 'none';
    interval: 'forecast' | 'no_leak_evidence';
  };
  decisions: DecisionRecordDto[];
};

export const candidatesQuerySchema = z.object({
  siteId: z.coerce.number().int().positive().max(2_147_483_647).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});

export type RetirementCandidateDto = {
  unitId: number;
  containerNumber: string;
  site: string | null;
  refrigerant: string;
  score: number;
  scoreBand: string;
  rollingLeakRatePct: number;
  ageYears: number;
  keepEac: number;
  cheapestId: EconomicOptionId;
  cheapestEac: number;
  retireEac: number;
  /** keep-topping-up EAC − cheapest EAC, per year. */
  yearlySaving: number;
  /** keep-topping-up EAC − retire EAC, per year (negative: retiring costs more). */
  retireSaving: number;
};

export type RetirementCandidatesDto = {
  asOf: string;
  currency: string;
  /** How many of the highest-scoring units were priced. */
  considered: number;
  candidates: RetirementCandidateDto[];
};
