import fc from 'fast-check';
import type { UnitEvent } from '../../../shared/domain';

/** The "as of" day of the worked examples. */
export const D = '2025-06-30';
const D_MS = Date.UTC(2025, 5, 30);

/** The ISO date k days after D (k < 0 for before). */
export function day(k: number): string {
  return new Date(D_MS + k * 86_400_000).toISOString().slice(0, 10);
}

/** Walks a value and returns the paths of any NaN or ±Infinity it holds. */
export function nonFinitePaths(value: unknown, path = '$'): string[] {
  if (typeof value === 'number') return Number.isFinite(value) ? [] : [path];
  if (Array.isArray(value)) return value.flatMap((v, i) => nonFinitePaths(v, `${path}[${i}]`));
  if (value !== null && typeof value === 'object') {
    return Object.entries(value).flatMap(([k, v]) => nonFinitePaths(v, `${path}.${k}`));
  }
  return [];
}

const location = fc.constantFrom(
  'service_valve',
  'brazed_joint',
  'condenser_coil',
  'evaporator_coil',
  'other' as const,
);
const visitId = fc.option(fc.constantFrom('v1', 'v2', 'v3', 'v4', 'v5'), { nil: undefined });
/** A timestamp within ~4 years before D: a calendar date or a full ISO time. */
const at = fc
  .tuple(fc.integer({ min: -1500, max: 0 }), fc.boolean(), fc.integer({ min: 0, max: 86_399 }))
  .map(([k, withTime, s]) => (withTime ? new Date(D_MS + k * 86_400_000 + s * 1000).toISOString() : day(k)));
const kg = fc.double({ min: 0, max: 8, noNaN: true });
const kPaG = fc.option(fc.double({ min: -101.325, max: 12_000, noNaN: true }), { nil: undefined });

/** Any valid event for a unit, within realistic bounds. */
export const eventArb: fc.Arbitrary<UnitEvent> = fc.oneof(
  fc.record({
    kind: fc.constantFrom('top_up', 'recovery', 'recharge' as const),
    at,
    kg,
    visitId,
    excluded: fc.option(fc.boolean(), { nil: undefined }),
  }),
  fc.record({
    kind: fc.constant('leak_check' as const),
    at,
    leakFound: fc.boolean(),
    location: fc.option(location, { nil: undefined }),
    visitId,
  }),
  fc.record({
    kind: fc.constant('repair' as const),
    at,
    location: fc.option(location, { nil: undefined }),
    verified: fc.boolean(),
    visitId,
  }),
  fc.record({
    kind: fc.constant('pressure' as const),
    at,
    suctionKPaG: kPaG,
    dischargeKPaG: kPaG,
    ambientC: fc.option(fc.double({ min: -40, max: 55, noNaN: true }), { nil: undefined }),
    sightGlass: fc.option(fc.constantFrom('full', 'bubbles', 'empty', 'not_checked' as const), { nil: undefined }),
    visitId,
  }),
  fc.record({ kind: fc.constant('pti' as const), at, passed: fc.boolean(), visitId }),
);

export const historyArb = fc.array(eventArb, { maxLength: 60 });

export const unitArb = fc.record({
  refrigerant: fc.constantFrom('R-134a', 'R-404A', 'R-452A', 'R-513A', 'R-1234yf', 'R-744'),
  nominalChargeKg: fc.double({ min: 0.5, max: 12, noNaN: true }),
  commissionedOn: fc.option(fc.integer({ min: -4000, max: 0 }).map(day), { nil: null }),
});

/** The unit of DOMAIN.md §6. */
export const section6Events: UnitEvent[] = [
  { kind: 'top_up', at: day(-300), kg: 1.0 },
  { kind: 'leak_check', at: day(-150), leakFound: true, location: 'service_valve' },
  { kind: 'top_up', at: day(-150), kg: 1.2 },
  { kind: 'repair', at: day(-150), location: 'service_valve', action: 'valve_core_replaced', verified: true },
  { kind: 'leak_check', at: day(-40), leakFound: true, location: 'service_valve' },
  { kind: 'top_up', at: day(-40), kg: 0.8 },
];
