// Quarantine of units: set by hand or for the units a trace search found, lifted by an engineer with a result.
import { z } from 'zod';
import { QUARANTINE_RESULT_IDS } from '../domain/quarantine';

export const MAX_QUARANTINE_UNITS = 500;
const key = z
  .string()
  .min(8)
  .max(64)
  .regex(/^[\w-]+$/, 'Bad idempotency key');
const reason = z.string().trim().min(3, 'Say why the unit is quarantined').max(300);

export const quarantineUnitsSchema = z.object({
  idempotencyKey: key,
  unitIds: z
    .array(z.number().int().positive())
    .min(1, 'Choose at least one unit')
    .max(MAX_QUARANTINE_UNITS, `At most ${MAX_QUARANTINE_UNITS} units at once; narrow the search first`),
  reason,
  /** Where the list came from: one unit by hand, or a trace search (the search in words). */
  source: z.enum(['hand', 'trace']).default('hand'),
  search: z.string().trim().max(300).optional(),
});
export type QuarantineUnitsInput = z.infer<typeof quarantineUnitsSchema>;

export const liftQuarantineSchema = z.object({
  idempotencyKey: key,
  result: z.enum(QUARANTINE_RESULT_IDS, { message: 'Say what was found' }),
  note: z.string().trim().min(3, 'Say how it was established').max(1000),
});
export type LiftQuarantineInput = z.infer<typeof liftQuarantineSchema>;

// --- responses ---------------------------------------------------------------------------------------------

export const quarantineUnitsResultDto = z.object({
  quarantined: z.array(z.number()),
  alreadyQuarantined: z.array(z.number()),
});
export type QuarantineUnitsResultDto = z.infer<typeof quarantineUnitsResultDto>;

export const liftQuarantineResultDto = z.object({ unitId: z.number(), eventId: z.number() });
export type LiftQuarantineResultDto = z.infer<typeof liftQuarantineResultDto>;
