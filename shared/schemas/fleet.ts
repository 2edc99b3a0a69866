// Fleet views: the fleet table (filters, sorting, pages), the overview charts, cylinder traceability.
import { z } from 'zod';
import { findRefrigerant, normalizeContainerNumber, REFRIGERANT_CODES } from '../domain';
import { positiveId } from './common';
import { DAY_AHEAD, type DayGroupId } from './day';
import { forecastAccuracyDto } from './forecast';
import { UNIT_STATUS_VALUES } from './history';

export const FLEET_SORTS = ['score', 'rate', 'forecast', 'leakCheck', 'pti', 'containerNumber', 'co2e'] as const;
export type FleetSort = (typeof FLEET_SORTS)[number];
export const FLEET_PAGE_SIZES = [10, 25, 50, 100] as const;
export const FLEET_DEFAULT_PAGE_SIZE = 25;
/** Beyond this many matches the count says "more than"; counting further buys nothing on screen. */
export const FLEET_COUNT_CAP = 10_000;
/** Deepest page a client may ask for (offset paging; narrow the filters instead). */
export const FLEET_MAX_PAGE = 4_000;
export const SCORE_BANDS = ['tight', 'watch', 'chronic'] as const;
export type ScoreBand = (typeof SCORE_BANDS)[number];

/** Query-string flags: "1"/"true" on, "0"/"false"/absent off. */
const flag = z
  .enum(['1', '0', 'true', 'false'], { message: 'Use 1 or 0' })
  .transform((v) => v === '1' || v === 'true')
  .optional();

export const refrigerantCodeSchema = z.string().transform((v, ctx) => {
  const r = findRefrigerant(v);
  if (!r) {
    ctx.addIssue({ code: 'custom', message: `Unknown refrigerant. Use one of ${REFRIGERANT_CODES.join(', ')}.` });
    return z.NEVER;
  }
  return r.code;
});

export const fleetFiltersSchema = z.object({
  siteId: positiveId('site').optional(),
  refrigerant: refrigerantCodeSchema.optional(),
  status: z.enum(UNIT_STATUS_VALUES, { message: 'Use in_service, out_of_service or retired' }).optional(),
  band: z.enum(SCORE_BANDS, { message: 'Use tight, watch or chronic' }).optional(),
  /** Rolling leak rate strictly above this, in % of the full charge. */
  rateAbove: z.coerce.number({ message: 'Enter a leak rate in %' }).min(0).max(100_000).optional(),
  /** Rolling leak rate at or above this (%): the overview's bars start here. */
  rateFrom: z.coerce.number({ message: 'Enter a leak rate in %' }).min(0).max(100_000).optional(),
  /** Rolling leak rate strictly below this (%): the overview's bars end here. */
  rateBelow: z.coerce.number({ message: 'Enter a leak rate in %' }).min(0).max(100_000).optional(),
  /** Rolling leak rate at most this (%); 0 = needed no refrigerant in the last 365 days. */
  rateAtMost: z.coerce.number({ message: 'Enter a leak rate in %' }).min(0).max(100_000).optional(),
  /** Next top-up forecast on or before today + N days (overdue ones included). */
  forecastDays: z.coerce.number({ message: 'Enter a number of days' }).int().min(0).max(3650).optional(),
  forecastOverdue: flag,
  /** Leak check overdue (retired units have none due). */
  leakCheckOverdue: flag,
  /** Leak check due from today to today + N days, not yet overdue (retired units have none due). */
  leakCheckDueDays: z.coerce.number({ message: 'Enter a number of days' }).int().min(0).max(3650).optional(),
  /** No passed PTI in force: expired, failed or never done. */
  ptiExpired: flag,
  /** In quarantine (not to be released until an engineer lifts it). */
  quarantined: flag,
  // My day's groups, each as a filter (retired units are in none of them): the same units at a site.
  /** A re-check due today or missed. */
  recheckDue: flag,
  /** A leak found and not repaired yet. */
  openLeak: flag,
  /** PTI expired within the last N days. */
  ptiExpiredDays: z.coerce.number({ message: 'Enter a number of days' }).int().min(1).max(3650).optional(),
  /** PTI running out from today to today + N days. */
  ptiExpiringDays: z.coerce.number({ message: 'Enter a number of days' }).int().min(0).max(3650).optional(),
  /** The next top-up's forecast range reaches into the next N days. */
  forecastRangeDays: z.coerce.number({ message: 'Enter a number of days' }).int().min(0).max(3650).optional(),
  /** The start of a container number, typed loosely ("hrlu 12"). */
  q: z
    .string()
    .max(20, 'Type at most 11 characters')
    .transform(normalizeContainerNumber)
    .pipe(
      z
        .string()
        .max(11, 'Type at most 11 characters')
        .regex(/^[A-Z0-9]*$/, 'Letters and digits only'),
    )
    .optional(),
});
export type FleetFilters = z.output<typeof fleetFiltersSchema>;

export const fleetQuerySchema = fleetFiltersSchema.extend({
  sort: z.enum(FLEET_SORTS, { message: `Sort by one of ${FLEET_SORTS.join(', ')}` }).default('score'),
  dir: z.enum(['asc', 'desc']).default('desc'),
  page: z.coerce
    .number()
    .int()
    .min(1)
    .max(FLEET_MAX_PAGE, `Pages go up to ${FLEET_MAX_PAGE}; narrow the filters`)
    .default(1),
  pageSize: z.coerce
    .number()
    .int()
    .refine((n) => (FLEET_PAGE_SIZES as readonly number[]).includes(n), {
      message: `Use a page size of ${FLEET_PAGE_SIZES.join(', ')}`,
    })
    .default(FLEET_DEFAULT_PAGE_SIZE),
  /** Also count the matches (the client asks only when the filters change). */
  count: flag,
});
export type FleetQuery = z.output<typeof fleetQuerySchema>;

export const fleetRowDto = z.object({
  unitId: z.number(),
  containerNumber: z.string(),
  refrigerant: z.string(),
  nominalChargeKg: z.number(),
  status: z.enum(UNIT_STATUS_VALUES),
  site: z.object({ id: z.number(), code: z.string(), name: z.string() }).nullable(),
  score: z.number(),
  scoreBand: z.enum(SCORE_BANDS),
  rollingLeakRatePct: z.number(),
  co2eTonnes: z.number(),
  forecastDate: z.string().nullable(),
  forecastOverdue: z.boolean(),
  nextLeakCheckDue: z.string().nullable(),
  leakCheckOverdue: z.boolean(),
  ptiValidUntil: z.string().nullable(),
  ptiValid: z.boolean(),
  pressureFlag: z.enum(['ok', 'possible_low_charge', 'unknown']),
  lastEventAt: z.string().nullable(),
  /** Why the engine could not compute this unit's figures (then they are placeholders), or null. */
  computeError: z.string().nullable(),
});
export type FleetRowDto = z.infer<typeof fleetRowDto>;

export const fleetCountDto = z.object({ total: z.number(), capped: z.boolean() });
export type FleetCountDto = z.infer<typeof fleetCountDto>;

export const fleetPageDto = z.object({
  rows: z.array(fleetRowDto),
  page: z.number(),
  pageSize: z.number(),
  hasMore: z.boolean(),
  /** Only when asked for with count=1. */
  count: fleetCountDto.optional(),
  /** The day "overdue" and "expired" are judged against (UTC). */
  asOf: z.string(),
});
export type FleetPageDto = z.infer<typeof fleetPageDto>;

// --- overview ------------------------------------------------------------------------------------------------

export const MAX_OVERVIEW_MONTHS = 36;
export const LEAK_CHECK_DUE_DAYS = 30;

export const fleetOverviewQuerySchema = z.object({
  months: z.coerce.number().int().min(1).max(MAX_OVERVIEW_MONTHS).default(12),
  siteId: positiveId('site').optional(),
  refrigerant: refrigerantCodeSchema.optional(),
});
export type FleetOverviewQuery = z.output<typeof fleetOverviewQuerySchema>;

/**
 * The fleet-table filters that hold exactly the units behind each count on the overview (same site and refrigerant):
 * every count there links to its rows. The server's overview counts with the same boundaries.
 */
export const overviewRows = {
  units: (q: Pick<FleetOverviewQuery, 'siteId' | 'refrigerant'>): FleetFilters => ({
    siteId: q.siteId,
    refrigerant: q.refrigerant,
  }),
  /** Needed no refrigerant in the last 365 days (not drawn in the distribution). */
  noRefrigerant: (q: Pick<FleetOverviewQuery, 'siteId' | 'refrigerant'>): FleetFilters => ({
    ...overviewRows.units(q),
    rateAtMost: 0,
  }),
  /** One bar of the distribution: from its start (above 0 for the first) to below its end. */
  bin: (q: Pick<FleetOverviewQuery, 'siteId' | 'refrigerant'>, bin: Pick<LeakRateBinDto, 'fromPct' | 'toPct'>) => ({
    ...overviewRows.units(q),
    ...(bin.fromPct === 0 ? { rateAbove: 0 } : { rateFrom: bin.fromPct }),
    rateBelow: bin.toPct ?? undefined,
  }),
  leakChecksDue: (q: Pick<FleetOverviewQuery, 'siteId' | 'refrigerant'>): FleetFilters => ({
    ...overviewRows.units(q),
    leakCheckDueDays: LEAK_CHECK_DUE_DAYS,
  }),
  leakChecksOverdue: (q: Pick<FleetOverviewQuery, 'siteId' | 'refrigerant'>): FleetFilters => ({
    ...overviewRows.units(q),
    leakCheckOverdue: true,
  }),
};

/** The fleet-table filters that hold the units of each group of My day at a site (the same rules, shared/schemas/day). */
export function dayGroupRows(siteId: number, group: DayGroupId): FleetFilters {
  const at = { siteId };
  switch (group) {
    case 'quarantine':
      return { ...at, quarantined: true };
    case 'recheck':
      return { ...at, recheckDue: true };
    case 'leak_check_overdue':
      return { ...at, leakCheckOverdue: true };
    case 'open_leak':
      return { ...at, openLeak: true };
    case 'pti_expired':
      return { ...at, ptiExpiredDays: 30 };
    case 'leak_check_due':
      return { ...at, leakCheckDueDays: DAY_AHEAD.leakCheckDays };
    case 'pti_expiring':
      return { ...at, ptiExpiringDays: DAY_AHEAD.ptiDays };
    case 'forecast':
      return { ...at, forecastRangeDays: DAY_AHEAD.forecastDays };
  }
}

export const leakRateBinDto = z.object({ fromPct: z.number(), toPct: z.number().nullable(), units: z.number() });
export type LeakRateBinDto = z.infer<typeof leakRateBinDto>;

const monthlySiteDto = z.object({
  month: z.string(),
  site: z.object({ id: z.number(), name: z.string() }).nullable(),
  madeUpKg: z.number(),
  co2eTonnes: z.number(),
});
const monthlyRefrigerantDto = z.object({
  month: z.string(),
  refrigerant: z.string(),
  madeUpKg: z.number(),
  co2eTonnes: z.number(),
});
const chronicLeakerDto = z.object({
  unitId: z.number(),
  containerNumber: z.string(),
  site: z.string().nullable(),
  refrigerant: z.string(),
  score: z.number(),
  scoreBand: z.enum(SCORE_BANDS),
  rollingLeakRatePct: z.number(),
  /** Score factors with their points (DOMAIN.md §6), largest first. */
  factors: z.array(z.object({ name: z.string(), points: z.number(), explanation: z.string() })),
});
const repairEffectivenessRowDto = z.object({
  location: z.string(),
  action: z.string().nullable(),
  repairs: z.number(),
  held: z.number(),
  recurred: z.number(),
  pending: z.number(),
  holdRatePct: z.number().nullable(),
});

export const fleetOverviewDto = z.object({
  asOf: z.string(),
  /** When the distribution, chronic leakers and leak checks due were read (they are shared for a few seconds). */
  figuresAt: z.string(),
  units: z.number(),
  leakRate: z.object({ zero: z.number(), bins: z.array(leakRateBinDto), thresholdPct: z.number() }),
  emissions: z.object({
    months: z.array(z.string()),
    gwpBasis: z.enum(['AR4', 'AR5']),
    /** Per month and site (CO2e summed over the site's refrigerants). */
    bySite: z.array(monthlySiteDto),
    /** Per month and refrigerant. */
    byRefrigerant: z.array(monthlyRefrigerantDto),
  }),
  chronicLeakers: z.array(chronicLeakerDto),
  repairEffectiveness: z.object({
    computedAt: z.string().nullable(),
    holdDays: z.number(),
    minRepairs: z.number(),
    rows: z.array(repairEffectivenessRowDto),
  }),
  leakChecksDue: z.object({
    days: z.number(),
    count: z.number(),
    overdue: z.number(),
    units: z.array(
      z.object({ unitId: z.number(), containerNumber: z.string(), site: z.string().nullable(), due: z.string() }),
    ),
  }),
  /** The next top-up forecast's accuracy on this fleet's own record (DOMAIN.md §7b); null before the first case base. */
  forecastAccuracy: forecastAccuracyDto.nullable(),
});
export type FleetOverviewDto = z.infer<typeof fleetOverviewDto>;
