// Fleet views: the fleet table (filters, sorting, pages), the overview charts, cylinder traceability.
import { z } from 'zod';
import { findRefrigerant, normalizeContainerNumber, REFRIGERANT_CODES } from '../domain';
import { positiveId } from './common';
import type { ForecastAccuracyDto } from './forecast';
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
  /** Next top-up forecast on or before today + N days (overdue ones included). */
  forecastDays: z.coerce.number({ message: 'Enter a number of days' }).int().min(0).max(3650).optional(),
  forecastOverdue: flag,
  leakCheckOverdue: flag,
  /** No passed PTI in force: expired, failed or never done. */
  ptiExpired: flag,
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

export type FleetRowDto = {
  unitId: number;
  containerNumber: string;
  refrigerant: string;
  nominalChargeKg: number;
  status: (typeof UNIT_STATUS_VALUES)[number];
  site: { id: number; code: string; name: string } | null;
  score: number;
  scoreBand: ScoreBand;
  rollingLeakRatePct: number;
  co2eTonnes: number;
  forecastDate: string | null;
  forecastOverdue: boolean;
  nextLeakCheckDue: string | null;
  leakCheckOverdue: boolean;
  ptiValidUntil: string | null;
  ptiValid: boolean;
  pressureFlag: 'ok' | 'possible_low_charge' | 'unknown';
  lastEventAt: string | null;
  /** Why the engine could not compute this unit's figures (then they are placeholders), or null. */
  computeError: string | null;
};

export type FleetCountDto = { total: number; capped: boolean };

export type FleetPageDto = {
  rows: FleetRowDto[];
  page: number;
  pageSize: number;
  hasMore: boolean;
  /** Only when asked for with count=1. */
  count?: FleetCountDto;
  /** The day "overdue" and "expired" are judged against (UTC). */
  asOf: string;
};

// --- overview ------------------------------------------------------------------------------------------------

export const MAX_OVERVIEW_MONTHS = 36;
export const LEAK_CHECK_DUE_DAYS = 30;

export const fleetOverviewQuerySchema = z.object({
  months: z.coerce.number().int().min(1).max(MAX_OVERVIEW_MONTHS).default(12),
  siteId: positiveId('site').optional(),
  refrigerant: refrigerantCodeSchema.optional(),
});
export type FleetOverviewQuery = z.output<typeof fleetOverviewQuerySchema>;

export type LeakRateBinDto = { fromPct: number; toPct: number | null; units: number };

export type FleetOverviewDto = {
  asOf: string;
  /** When the distribution, chronic leakers and leak checks due were read (they are shared for a few seconds). */
  figuresAt: string;
  units: number;
  leakRate: { zero: number; bins: LeakRateBinDto[]; thresholdPct: number };
  emissions: {
    months: string[];
    gwpBasis: 'AR4' | 'AR5';
    /** Per month and site (CO2e summed over the site's refrigerants). */
    bySite: { month: string; site: { id: number; name: string } | null; madeUpKg: number; co2eTonnes: number }[];
    /** Per month and refrigerant. */
    byRefrigerant: { month: string; refrigerant: string; madeUpKg: number; co2eTonnes: number }[];
  };
  chronicLeakers: {
    unitId: number;
    containerNumber: string;
    site: string | null;
    refrigerant: string;
    score: number;
    scoreBand: ScoreBand;
    rollingLeakRatePct: number;
    /** Score factors with their points (DOMAIN.md §6), largest first. */
    factors: { name: string; points: number; explanation: string }[];
  }[];
  repairEffectiveness: {
    computedAt: string | null;
    holdDays: number;
    minRepairs: number;
    rows: {
      location: string;
      action: string | null;
      repairs: number;
      held: number;
      recurred: number;
      pending: number;
      holdRatePct: number | null;
    }[];
  };
  leakChecksDue: {
    days: number;
    count: number;
    overdue: number;
    units: { unitId: number; containerNumber: string; site: string | null; due: string }[];
  };
  /** The next top-up forecast's accuracy on this fleet's own record (DOMAIN.md §7b); null before the first case base. */
  forecastAccuracy: ForecastAccuracyDto | null;
};
