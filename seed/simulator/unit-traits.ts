// What a unit is, drawn once before its history: age, refrigerant, model and charge, how leak-prone it is, its home
// depot and rhythm of trips, and the hidden constants of its circuit; at the end, the unit's own row.
import { co2eTonnes, leakCheckIntervalMonths, type LeakLocationId, type RefrigerantCode } from '../../shared/domain';
import { LEAK_LOCATION_WEIGHTS, MODELS, inventedPurchaseCost, refrigerantMix } from './catalogue';
import { DAY_MS, clamp, isoDay, r3, roundTo } from './numbers';
import type { Rng } from './prng';
import type { FleetContext, LeakClass, Profile, SimUnit } from './unit-sim';

export type UnitTraits = {
  ageYears: number;
  commissionDay: number;
  refrigerant: RefrigerantCode;
  model: (typeof MODELS)[number];
  /** The nominal charge, kg. */
  full: number;
  recordStartDay: number;
  /** Commissioned inside the record (its first fill is in it). */
  newInRecord: boolean;
  buildYear: number;
  leakClass: LeakClass;
  homeSite: number;
  tripMeanDays: number;
  /** Shares of the charge missing when the sight glass shows bubbles, and when the unit can no longer hold its set point. */
  sightGlassAt: number;
  alarmAt: number;
  /** Condensing approach and evaporator temperature difference at full charge, K. */
  approach0: number;
  evapDelta0: number;
  permeationKgPerDay: number;
  hazardPerYear: number;
  holdMultiplier: number;
  weakSpot: LeakLocationId;
  /** Months between the leak checks the unit's CO2e calls for; null when none are required. */
  leakCheckIntervalMonths: number | null;
};

const CLASS_HAZARD: Record<LeakClass, number> = { tight: 0.03, slow: 0.14, chronic: 0.7 };

export function drawTraits(fleet: FleetContext, p: Profile, rng: Rng): UnitTraits {
  const ageYears = p.ageYears ?? rng.uniform(0.2, 15);
  const commissionDay = fleet.todayDay - Math.round(ageYears * 365.25);
  const refrigerant = p.refrigerant ?? rng.weighted(refrigerantMix(ageYears));
  const model = rng.pick(MODELS.filter((m) => m.refrigerants.includes(refrigerant)));
  const full = p.chargeKg ?? r3(roundTo(refrigerant === 'R-744' ? rng.uniform(4, 4.8) : rng.uniform(4, 6), 0.05));
  const historyDays = Math.round((p.historyYears ?? fleet.historyYears) * 365.25);
  const recordStartDay = Math.max(commissionDay, fleet.todayDay - historyDays);
  const newInRecord = commissionDay >= fleet.todayDay - historyDays;
  const buildYear = new Date(commissionDay * DAY_MS).getUTCFullYear() - (rng.chance(0.3) ? 1 : 0);

  const pChronic = 0.04 + 0.006 * ageYears;
  const pSlow = 0.16 + 0.008 * ageYears;
  const x = rng.next();
  const cls: LeakClass = p.leakClass ?? (x < pChronic ? 'chronic' : x < pChronic + pSlow ? 'slow' : 'tight');

  const homeSite = p.homeSite ?? rng.weighted(fleet.depots.map((s, k) => [s, 1 / Math.sqrt(k + 1)] as const));
  const tripMeanDays = p.daily ? 1 : clamp(rng.normal(96, 13), 60, 140);
  const sightGlassAt = rng.uniform(0.08, 0.15);
  const alarmAt = rng.uniform(0.28, 0.4);
  const approach0 = rng.uniform(8, 13);
  const evapDelta0 = rng.uniform(5.5, 8);
  const permeationKgPerDay = (full * rng.uniform(0.002, 0.01)) / 365;
  return {
    ageYears,
    commissionDay,
    refrigerant,
    model,
    full,
    recordStartDay,
    newInRecord,
    buildYear,
    leakClass: cls,
    homeSite,
    tripMeanDays,
    sightGlassAt,
    alarmAt,
    approach0,
    evapDelta0,
    permeationKgPerDay,
    hazardPerYear: p.hazardPerYear ?? CLASS_HAZARD[cls],
    holdMultiplier: p.holdMultiplier ?? (cls === 'chronic' ? 0.7 : 1),
    weakSpot: p.weakSpot ?? rng.weighted(LEAK_LOCATION_WEIGHTS),
    leakCheckIntervalMonths: leakCheckIntervalMonths(co2eTonnes(refrigerant, full)),
  };
}

/** The unit's row as the registry knows it, drawn after its history (the stream continues where the history ended). */
export function unitRow(
  t: UnitTraits,
  rng: Rng,
  history: { containerNumber: string; status: SimUnit['status']; updatedMs: number },
): SimUnit {
  const createdMs = t.newInRecord ? t.recordStartDay * DAY_MS : (t.recordStartDay - rng.int(1, 30)) * DAY_MS;
  return {
    containerNumber: history.containerNumber,
    refrigerant: t.refrigerant,
    nominalChargeKg: t.full,
    commissionedOn: rng.chance(0.03) ? null : isoDay(t.commissionDay),
    homeSite: t.homeSite,
    status: history.status,
    qrToken: Buffer.from(rng.bytes(32)).toString('base64url'),
    machinerySerial: `${t.model.serialPrefix}${String(t.buildYear % 100).padStart(2, '0')}-${String(rng.int(0, 99_999)).padStart(5, '0')}`,
    model: t.model.model,
    manufactureYear: t.buildYear,
    purchaseCost: inventedPurchaseCost(t.buildYear, rng.next()),
    residualValue: t.ageYears > 10 ? Math.round(rng.uniform(2400, 3600) / 50) * 50 : null,
    createdMs,
    updatedMs: Math.max(createdMs, history.updatedMs),
  };
}
