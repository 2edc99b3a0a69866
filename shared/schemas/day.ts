// The depot's working day: a unit's re-checks and depot state, and My day (the units at a site that need something).
import { z } from 'zod';
import type { Recheck } from '../domain/rechecks';

export const dayQuerySchema = z.object({
  /** Without it: the site where the person last recorded work. */
  siteId: z.coerce.number().int().positive().optional(),
});
export type DayQuery = z.infer<typeof dayQuerySchema>;

/** My day's groups, most urgent first. */
export const DAY_GROUPS = [
  { id: 'quarantine', label: 'In quarantine' },
  { id: 'recheck', label: 'Re-checks due' },
  { id: 'leak_check_overdue', label: 'Leak checks overdue' },
  { id: 'open_leak', label: 'Open leaks without a repair' },
  { id: 'pti_expired', label: 'PTI expired' },
  { id: 'leak_check_due', label: 'Leak checks due within 30 days' },
  { id: 'pti_expiring', label: 'PTI expiring within 14 days' },
  { id: 'forecast', label: 'Top-ups forecast within 14 days' },
] as const;
export type DayGroupId = (typeof DAY_GROUPS)[number]['id'];
export const DAY_GROUP_IDS = DAY_GROUPS.map((g) => g.id) as [DayGroupId, ...DayGroupId[]];
/** How far ahead My day looks for what is coming due (our own choice). */
export const DAY_AHEAD = { leakCheckDays: 30, ptiDays: 14, forecastDays: 14 } as const;
/** Rows per group: a phone screen's worth; the fleet table holds the rest. */
export const DAY_GROUP_LIMIT = 50;

/** Which visit form a row opens: the entry to preselect. */
export const DAY_ACTIONS = ['pressure', 'leak_check', 'pti', 'repair', 'top_up', 'quarantine'] as const;
export type DayAction = (typeof DAY_ACTIONS)[number];

// --- responses ---------------------------------------------------------------------------------------------

export const dayRowDto = z.object({
  unitId: z.number(),
  containerNumber: z.string(),
  /** Why, in words. */
  why: z.string(),
  /** The day it is or was due, when there is one. */
  dueOn: z.string().nullable(),
  action: z.enum(DAY_ACTIONS),
});
export type DayRowDto = z.infer<typeof dayRowDto>;

export const dayDto = z.object({
  site: z.object({ id: z.number(), name: z.string(), code: z.string() }).nullable(),
  /** Every site, for choosing another. */
  sites: z.array(z.object({ id: z.number(), name: z.string() })),
  today: z.string(),
  groups: z.array(
    z.object({ id: z.enum(DAY_GROUP_IDS), label: z.string(), total: z.number(), rows: z.array(dayRowDto) }),
  ),
});
export type DayDto = z.infer<typeof dayDto>;

export const depotQuarantineDto = z.object({
  since: z.string(),
  reason: z.string(),
  eventId: z.number(),
  marks: z.number(),
});
export type DepotQuarantineDto = z.infer<typeof depotQuarantineDto>;

const recheckDto = z.custom<Recheck & { words: string }>();

export const unitDepotDto = z.object({
  rechecks: z.array(recheckDto),
  openRecheck: recheckDto.nullable(),
  missedRechecks365: z.number(),
  quarantine: depotQuarantineDto.nullable(),
  pti: z.object({
    validUntil: z.string().nullable(),
    passed: z.boolean().nullable(),
    /** Passed, not expired and the unit not in quarantine: the unit may be released. */
    valid: z.boolean(),
    /** Why not, in words. */
    invalidBecause: z.string().nullable(),
    /** What stands in the way of a passed PTI now (open leak, low charge, quarantine). */
    blockers: z.array(z.object({ code: z.string(), words: z.string() })),
  }),
});
export type UnitDepotDto = z.infer<typeof unitDepotDto>;
