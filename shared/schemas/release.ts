// Release for loading: a structured PTI and the release that needs a valid one.
import { z } from 'zod';
import { PTI_ITEM_IDS, type PtiBlocker, type PtiOverall } from '../domain/pti';
import { momentSchema } from './common';

const key = z
  .string()
  .min(8)
  .max(64)
  .regex(/^[\w-]+$/, 'Bad idempotency key');
const reading = (min: number, max: number) => z.number().min(min).max(max).optional();

export const ptiItemSchema = z.object({
  id: z.enum(PTI_ITEM_IDS),
  result: z.enum(['passed', 'failed', 'not_done'], { message: 'Passed, failed or not done?' }),
  readings: z
    .object({
      supplyVoltageV: reading(0, 700),
      setPointC: reading(-40, 30),
      supplyAirC: reading(-80, 90),
      returnAirC: reading(-80, 90),
      suctionKPaG: reading(-101.325, 20_000),
      dischargeKPaG: reading(-101.325, 20_000),
    })
    .optional(),
});

export const recordPtiSchema = z
  .object({
    idempotencyKey: key,
    occurredAt: momentSchema({ format: 'Enter when the PTI was done' }).optional(),
    siteId: z.number().int().positive().nullable().optional(),
    items: z
      .array(ptiItemSchema)
      .min(1, 'Go through the checklist')
      .refine((items) => new Set(items.map((i) => i.id)).size === items.length, 'Each item once'),
    /** An engineer's reason to record a pass in spite of what stands in the way; kept in the history. */
    override: z.object({ reason: z.string().trim().min(10, 'Say why the unit may pass anyway').max(500) }).optional(),
    /** Record the PTI as not passed when something stands in the way (the technician's way out of a refusal). */
    recordAsNotPassed: z.boolean().optional(),
    note: z.string().trim().max(2000).optional(),
  })
  .refine((v) => !(v.override && v.recordAsNotPassed), { message: 'Override or record as not passed, not both' });
export type RecordPtiInput = z.infer<typeof recordPtiSchema>;

export const releaseUnitSchema = z.object({
  idempotencyKey: key,
  siteId: z.number().int().positive().nullable().optional(),
  note: z.string().trim().max(500).optional(),
});
export type ReleaseUnitInput = z.infer<typeof releaseUnitSchema>;

// --- responses ---------------------------------------------------------------------------------------------

export const recordPtiResultDto = z.object({
  eventId: z.number(),
  overall: z.enum(['passed', 'failed', 'incomplete'] satisfies PtiOverall[]),
  /** What was recorded: passed only when the checklist passed and nothing stood in the way, or an engineer overrode. */
  passed: z.boolean(),
  blockers: z.array(z.custom<PtiBlocker>()),
  overridden: z.boolean(),
});
export type RecordPtiResultDto = z.infer<typeof recordPtiResultDto>;

export const releaseResultDto = z.object({ eventId: z.number(), ptiValidUntil: z.string() });
export type ReleaseResultDto = z.infer<typeof releaseResultDto>;
