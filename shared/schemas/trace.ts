// Which units were charged from a cylinder or lot, or at a site in a period; marking them for inspection.
import { z } from 'zod';
import { daySchema, positiveId } from './common';

export const MAX_TRACE_ROWS = 2000;
export const MAX_TRACE_DAYS = 731;
export const MAX_MARK_UNITS = 5000;

const isoDay = (label: string) => daySchema({ format: `Enter the ${label} as a date, e.g. 2026-03-31` });

export const traceQuerySchema = z
  .object({
    cylinder: z.string().trim().min(2, 'Type at least 2 characters of the cylinder or lot').max(64).optional(),
    /** A cylinder of the register: every charge linked to it, whatever was typed beside it. */
    cylinderId: positiveId('cylinder').optional(),
    siteId: positiveId('site').optional(),
    from: isoDay('first day').optional(),
    to: isoDay('last day').optional(),
  })
  .superRefine((q, ctx) => {
    if (!q.cylinder && !q.siteId && !q.cylinderId) {
      ctx.addIssue({ code: 'custom', message: 'Search by cylinder or lot, or by site and dates', path: ['cylinder'] });
    }
    if (q.siteId && !q.cylinder && !q.cylinderId && (!q.from || !q.to)) {
      ctx.addIssue({
        code: 'custom',
        message: 'Give the first and last day for a search by site',
        path: [q.from ? 'to' : 'from'],
      });
    }
    if (q.from && q.to) {
      if (q.to < q.from) ctx.addIssue({ code: 'custom', message: 'The last day is before the first', path: ['to'] });
      else if ((Date.parse(q.to) - Date.parse(q.from)) / 86_400_000 > MAX_TRACE_DAYS) {
        ctx.addIssue({ code: 'custom', message: 'Search at most two years at a time', path: ['to'] });
      }
    }
  });
export type TraceQuery = z.output<typeof traceQuerySchema>;

export const traceChargeDto = z.object({
  eventId: z.number(),
  unitId: z.number(),
  containerNumber: z.string(),
  refrigerant: z.string(),
  kind: z.enum(['top_up', 'recharge']),
  kg: z.number(),
  cylinder: z.string().nullable(),
  occurredAt: z.string(),
  site: z.object({ id: z.number(), name: z.string() }).nullable(),
  technician: z.object({ id: z.string(), name: z.string() }),
});
export type TraceChargeDto = z.infer<typeof traceChargeDto>;

export const traceResultDto = z.object({
  charges: z.array(traceChargeDto),
  /** All matching charges (the list stops at MAX_TRACE_ROWS). */
  totalCharges: z.number(),
  units: z.array(
    z.object({
      unitId: z.number(),
      containerNumber: z.string(),
      charges: z.number(),
      kg: z.number(),
      markedAt: z.string().nullable(),
    }),
  ),
  totalKg: z.number(),
  /** Voided charges are left out; this many matched. */
  voidedExcluded: z.number(),
});
export type TraceResultDto = z.infer<typeof traceResultDto>;

export const markForInspectionSchema = z.object({
  query: z.object({
    cylinder: z.string().optional(),
    siteId: z.number().int().positive().optional(),
    from: z.string().optional(),
    to: z.string().optional(),
  }),
  reason: z.string().trim().min(3, 'Say why these units are marked').max(500),
  /** Chosen by the client: a retried request marks nothing twice. */
  idempotencyKey: z
    .string()
    .min(8)
    .max(40)
    .regex(/^[\w-]+$/, 'Bad idempotency key'),
});
export type MarkForInspectionInput = z.infer<typeof markForInspectionSchema>;

export const markForInspectionResultDto = z.object({
  marked: z.number(),
  replayed: z.boolean(),
  eventIds: z.array(z.number()),
});
export type MarkForInspectionResultDto = z.infer<typeof markForInspectionResultDto>;
