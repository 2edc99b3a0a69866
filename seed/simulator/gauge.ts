// A pressure reading as a technician takes it: condensing at ambient + approach (the approach shrinking as charge is
// lost), evaporating below the set point, read off a psi, bar or kPa gauge, with the sight glass and air temperatures.
import { KPA_PER_BAR, KPA_PER_PSI, absoluteToGaugeKPa, saturationPressureKPa } from '../../shared/domain';
import type { SiteSpec } from './catalogue';
import { DAY_MS, clamp, r1 } from './numbers';
import type { Rng } from './prng';
import type { UnitRun } from './unit-run';
import type { SimEvent } from './unit-sim';

/** The air temperature at a site: yearly and daily swings and some weather. */
function ambientAt(rng: Rng, site: SiteSpec, ms: number): number {
  const c = site.climate;
  const dayOfYear = (ms / DAY_MS) % 365.25;
  const seasonal = Math.cos((2 * Math.PI * (dayOfYear - (c.southern ? 17 : 200))) / 365.25);
  const hour = (ms % DAY_MS) / 3_600_000;
  const daily = -2.5 * Math.cos((2 * Math.PI * (hour - 3)) / 24);
  return r1(clamp(c.meanC + c.swingC * seasonal + daily + rng.normal(0, 2.5), -15, 45));
}

export function gaugeReading(run: UnitRun, site: number, ms: number, setPointC: number): SimEvent {
  const { rng } = run;
  const { refrigerant, full, approach0, evapDelta0, sightGlassAt } = run.traits;
  const frac = run.leak.deficitKg / full;
  const ambientC = ambientAt(rng, run.fleet.sites[site], ms);
  const approach = Math.max(1.5, approach0 - 20 * frac + rng.normal(0, 0.6));
  const condensingC = clamp(ambientC + approach, -40, 58);
  const dischargeAbs =
    refrigerant === 'R-744' && condensingC >= 29.5
      ? // Above the critical point a CO2 unit runs transcritical: a gas-cooler pressure, not a saturation one.
        clamp(7800 + (condensingC - 30) * 230 - frac * 1500 + rng.normal(0, 80), 7450, 12500)
      : saturationPressureKPa(refrigerant, condensingC, 'dew');
  const evaporatingC = clamp(setPointC - (evapDelta0 + 14 * frac + rng.normal(0, 0.6)), -49, 5);
  const suctionAbs = saturationPressureKPa(refrigerant, evaporatingC, 'dew');
  let suctionKPaG = absoluteToGaugeKPa(suctionAbs);
  let dischargeKPaG = absoluteToGaugeKPa(dischargeAbs);
  let details: Record<string, unknown> | undefined;
  const unitPick = rng.next();
  if (unitPick < 0.15) {
    // Read on a psi gauge to the nearest psi.
    suctionKPaG = Math.round(Math.round(suctionKPaG / KPA_PER_PSI) * KPA_PER_PSI * 100) / 100;
    dischargeKPaG = Math.round(Math.round(dischargeKPaG / KPA_PER_PSI) * KPA_PER_PSI * 100) / 100;
    details = { enteredAs: { pressureUnit: 'psi', temperatureUnit: 'C' } };
  } else if (unitPick < 0.45) {
    suctionKPaG = r1(suctionKPaG / KPA_PER_BAR) * KPA_PER_BAR;
    dischargeKPaG = r1(dischargeKPaG / KPA_PER_BAR) * KPA_PER_BAR;
    details = { enteredAs: { pressureUnit: 'bar', temperatureUnit: 'C' } };
  } else {
    suctionKPaG = Math.round(suctionKPaG);
    dischargeKPaG = Math.round(dischargeKPaG);
  }
  const sightGlass = rng.chance(0.07)
    ? 'not_checked'
    : frac < sightGlassAt
      ? 'full'
      : frac < 0.45
        ? 'bubbles'
        : 'empty';
  const supplyAirC = r1(setPointC + Math.max(0, frac - 0.22) * 25 + rng.normal(0.3, 0.3));
  return {
    kind: 'pressure',
    suctionKPaG,
    dischargeKPaG,
    ambientC,
    setPointC,
    supplyAirC,
    returnAirC: r1(supplyAirC + rng.uniform(2, 4)),
    sightGlass,
    details,
  };
}
