// The refrigerant log: every addition and recovery, and the leak checks, per period, site and refrigerant.
import { z } from 'zod';
import { daySchema } from './common';
import { refrigerantCodeSchema } from './fleet';

export const MAX_LOG_DAYS = 366;
export const LOG_PAGE_SIZE = 100;

export const refrigerantLogQuerySchema = z
  .object({
    from: daySchema({ format: 'Enter the first day, e.g. 2026-01-01' }),
    to: daySchema({ format: 'Enter the last day, e.g. 2026-12-31' }),
    siteId: z.coerce.number().int().positive().max(2_147_483_647).optional(),
    refrigerant: refrigerantCodeSchema.optional(),
    /** Keyset paging, newest first: the `nextBefore` of the previous page (time and event id of its last entry). */
    before: z
      .string()
      .regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z_\d+$/, 'Not a page marker from this log')
      .optional(),
  })
  .superRefine((q, ctx) => {
    if (q.to < q.from) ctx.addIssue({ code: 'custom', message: 'The last day is before the first', path: ['to'] });
    else if ((Date.parse(q.to) - Date.parse(q.from)) / 86_400_000 >= MAX_LOG_DAYS) {
      ctx.addIssue({ code: 'custom', message: 'Show at most one year at a time', path: ['to'] });
    }
  });
export type RefrigerantLogQuery = z.output<typeof refrigerantLogQuerySchema>;

export const LOG_ENTRY_KINDS = ['top_up', 'recharge', 'recovery', 'leak_check'] as const;
export type LogEntryKind = (typeof LOG_ENTRY_KINDS)[number];

export const refrigerantLogEntryDto = z.object({
  eventId: z.number(),
  occurredAt: z.string(),
  kind: z.enum(LOG_ENTRY_KINDS),
  unit: z.object({ id: z.number(), containerNumber: z.string() }),
  refrigerant: z.string(),
  site: z.object({ id: z.number(), name: z.string() }).nullable(),
  /** Refrigerant movements only. */
  kg: z.number().nullable(),
  co2eTonnes: z.number().nullable(),
  cylinder: z.string().nullable(),
  /** Recycled or reclaimed gas was used (Reg. (EU) No 517/2014 Art. 6 record). */
  reusedRecovered: z.boolean().nullable(),
  /** A first fill or retrofit charge: recorded, but not made-up refrigerant. */
  excludedFromLeakRate: z.boolean().nullable(),
  /** Leak checks only. */
  method: z.string().nullable(),
  leakFound: z.boolean().nullable(),
  location: z.string().nullable(),
  technician: z.object({
    id: z.string(),
    name: z.string(),
    certificateNumber: z.string().nullable(),
    /** The certificate's last valid day as held on the day of the work. */
    certificateExpiresOn: z.string().nullable(),
  }),
});
export type RefrigerantLogEntryDto = z.infer<typeof refrigerantLogEntryDto>;

export const refrigerantLogTotalsDto = z.object({
  refrigerant: z.string(),
  addedKg: z.number(),
  /** Null when the total cannot be computed (old rows with a mass the engine refuses). */
  addedCo2eTonnes: z.number().nullable(),
  recoveredKg: z.number(),
  recoveredCo2eTonnes: z.number().nullable(),
  additions: z.number(),
  recoveries: z.number(),
  leakChecks: z.number(),
  leaksFound: z.number(),
});
export type RefrigerantLogTotalsDto = z.infer<typeof refrigerantLogTotalsDto>;

export const refrigerantLogDto = z.object({
  from: z.string(),
  to: z.string(),
  gwpBasis: z.enum(['AR4', 'AR5']),
  /** The leak-check rule the log is kept under: the chosen site's, else the fleet's policy. */
  rule: z.object({ jurisdiction: z.enum(['EU', 'US', 'custom']), siteName: z.string().nullable(), words: z.string() }),
  entries: z.array(refrigerantLogEntryDto),
  nextBefore: z.string().nullable(),
  totals: z.array(refrigerantLogTotalsDto),
  /** Voided entries in the period, left out of the list and the totals. */
  voidedExcluded: z.number(),
});
export type RefrigerantLogDto = z.infer<typeof refrigerantLogDto>;
