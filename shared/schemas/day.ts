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
export type DayAction = 'pressure' | 'leak_check' | 'pti' | 'repair' | 'top_up' | 'quarantine';

export type DayRowDto = {
  unitId: number;
  containerNumber: string;
  /** Why, in words. */
  why: string;
  /** The day it is or was due, when there is one. */
  dueOn: string | null;
  action: DayAction;
};

export type DayDto = {
  site: { id: number; name: string; code: string } | null;
  /** Every site, for choosing another. */
  sites: { id: number; name: string }[];
  today: string;
  groups: { id: DayGroupId; label: string; total: number; rows: DayRowDto[] }[];
};

export type DepotQuarantineDto = { since: string; reason: string; eventId: number; marks: number };

export type UnitDepotDto = {
  rechecks: (Recheck & { words: string })[];
  openRecheck: (Recheck & { words: string }) | null;
  missedRechecks365: number;
  quarantine: DepotQuarantineDto | null;
  pti: {
    validUntil: string | null;
    passed: boolean | null;
    /** Passed, not expired and the unit not in quarantine: the unit may be released. */
    valid: boolean;
    /** Why not, in words. */
    invalidBecause: string | null;
    /** What stands in the way of a passed PTI now (open leak, low charge, quarantine). */
    blockers: { code: string; words: string }[];
  };
};
