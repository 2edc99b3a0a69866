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

export type RefrigerantLogEntryDto = {
  eventId: number;
  occurredAt: string;
  kind: LogEntryKind;
  unit: { id: number; containerNumber: string };
  refrigerant: string;
  site: { id: number; name: string } | null;
  /** Refrigerant movements only. */
  kg: number | null;
  co2eTonnes: number | null;
  cylinder: string | null;
  /** Recycled or reclaimed gas was used (Reg. (EU) No 517/2014 Art. 6 record). */
  reusedRecovered: boolean | null;
  /** A first fill or retrofit charge: recorded, but not made-up refrigerant. */
  excludedFromLeakRate: boolean | null;
  /** Leak checks only. */
  method: string | null;
  leakFound: boolean | null;
  location: string | null;
  technician: { id: string; name: string; certificateNumber: string | null };
};

export type RefrigerantLogTotalsDto = {
  refrigerant: string;
  addedKg: number;
  /** Null when the total cannot be computed (old rows with a mass the engine refuses). */
  addedCo2eTonnes: number | null;
  recoveredKg: number;
  recoveredCo2eTonnes: number | null;
  additions: number;
  recoveries: number;
  leakChecks: number;
  leaksFound: number;
};

export type RefrigerantLogDto = {
  from: string;
  to: string;
  gwpBasis: 'AR4' | 'AR5';
  entries: RefrigerantLogEntryDto[];
  nextBefore: string | null;
  totals: RefrigerantLogTotalsDto[];
  /** Voided entries in the period, left out of the list and the totals. */
  voidedExcluded: number;
};
