import { describe, expect, it } from 'vitest';
import {
  approachDriftWords,
  assessPressureHealth,
  computeUnitStats,
  convertPressure,
  DomainError,
} from '../../../shared/domain';
import { settingsSchema } from '../../../shared/schemas/settings';
import { D, day } from './helpers';

const psi = (v: number) => convertPressure(v, { unit: 'psi', ref: 'gauge' }, { unit: 'kPa', ref: 'gauge' });

describe('pressure health', () => {
  it('flags an undercharged R-134a unit whose discharge fell from 140 to 125 psi', () => {
    // Common practice, no published source: ≈ 9.5 bar (140 psi) once recharged, ≈ 8.6 bar (125 psi) undercharged
    // (DOMAIN.md §1). Dew points from Tillner-Roth & Baehr (1994): 140 psig = 1066.6 kPa abs → 41.81 °C;
    // 125 psig = 963.2 kPa abs → 38.01 °C. Ambient 30 °C: baseline approach 11.81 K, later 8.01 K,
    // drift −3.80 K ≤ −3 K → "possible low charge".
    const { snapshots, health } = assessPressureHealth(
      'R-134a',
      [
        { at: day(-60), dischargeKPaG: psi(140), ambientC: 30 },
        { at: day(-50), dischargeKPaG: psi(140), ambientC: 30 },
        { at: day(-5), dischargeKPaG: psi(125), ambientC: 30, suctionKPaG: 100 },
      ],
      [day(-60)],
    );
    expect(snapshots[0].condensingC).toBeCloseTo(41.81, 2);
    expect(health.baselineApproachK).toBeCloseTo(11.81, 2);
    expect(health.latest?.condensingC).toBeCloseTo(38.01, 2);
    expect(health.driftK).toBeCloseTo(-3.8, 2);
    expect(health.flag).toBe('possible_low_charge');
    expect(health.explanation).toContain('below its post-charge baseline');
    // Evaporating from suction: 100 kPa(g) = 201.3 kPa abs → about −10 °C on the R-134a dew curve
    expect(health.latest?.evaporatingC).toBeCloseTo(-10.1, 0);
  });

  it('takes the median of the first 30 days only as the baseline', () => {
    // Our definition (DOMAIN.md §8): approaches 12 and 10 K inside the window → baseline 11 K;
    // the D−20 reading (approach 20 K) is outside it, drift 9 K → "ok"
    const dew = (k: number) => ({ dischargeKPaG: psi(140), ambientC: 41.806 - k });
    const { health, snapshots } = assessPressureHealth(
      'R-134a',
      [
        { at: day(-45), ...dew(10) },
        { at: day(-59), ...dew(12) },
        { at: day(-20), ...dew(20) },
      ],
      [day(-60)],
    );
    expect(snapshots.map((s) => s.at)).toEqual([day(-59), day(-45), day(-20)]);
    expect(health.baselineApproachK).toBeCloseTo(11, 2);
    expect(health.driftK).toBeCloseTo(9, 2);
    expect(health.flag).toBe('ok');
  });

  it('flags bubbles or an empty sight glass whatever the pressures say', () => {
    // Common practice, no published source (DOMAIN.md §8)
    expect(assessPressureHealth('R-134a', [{ at: day(-1), sightGlass: 'bubbles' }], []).health.flag).toBe(
      'possible_low_charge',
    );
    expect(assessPressureHealth('R-134a', [{ at: day(-1), sightGlass: 'empty' }], []).health.explanation).toContain(
      'no liquid',
    );
  });

  it('says ok on a full sight glass without a baseline, and unknown with nothing to go on', () => {
    expect(assessPressureHealth('R-134a', [{ at: day(-1), sightGlass: 'full' }], []).health.flag).toBe('ok');
    expect(assessPressureHealth('R-134a', [{ at: day(-1), dischargeKPaG: 900, ambientC: 25 }], []).health.flag).toBe(
      'unknown',
    );
    expect(assessPressureHealth('R-134a', [], []).health).toMatchObject({ latest: null, flag: 'unknown' });
  });

  it('waits for a reading after the last recharge', () => {
    const { health } = assessPressureHealth('R-134a', [{ at: day(-10), sightGlass: 'bubbles' }], [day(-5)]);
    expect(health).toMatchObject({ flag: 'unknown', driftK: null, baselineApproachK: null });
  });

  it('leaves the condensing temperature out when CO2 is supercritical', () => {
    // Our definition: no saturation above the R-744 critical point (7377 kPa abs), so no approach
    const { snapshots } = assessPressureHealth(
      'R-744',
      [{ at: day(-1), dischargeKPaG: 9000, suctionKPaG: 3000, ambientC: 35 }],
      [],
    );
    expect(snapshots[0]).toMatchObject({
      condensingC: null,
      approachK: null,
      dischargeOutOfRange: 'supercritical',
      suctionOutOfRange: null,
    });
    // From memory (Span & Wagner ancillary): 3101 kPa abs is about −4 °C
    expect(snapshots[0].evaporatingC).toBeCloseTo(-4, 0);
  });

  it('leaves a reading below the fitted range out rather than extrapolating', () => {
    // Our definition (DOMAIN.md §3): R-404A data starts at −50 °C (81 kPa abs); −60 kPa(g) = 41 kPa abs is below
    const { snapshots } = assessPressureHealth('R-404A', [{ at: day(-1), suctionKPaG: -60, dischargeKPaG: 4000 }], []);
    expect(snapshots[0]).toMatchObject({
      evaporatingC: null,
      suctionOutOfRange: 'below_range',
      dischargeOutOfRange: 'above_range',
    });
  });

  it('follows the drift threshold in settings', () => {
    const settings = settingsSchema.parse({ pressure: { driftFlagK: -5 } });
    const { health } = assessPressureHealth(
      'R-134a',
      [
        { at: day(-60), dischargeKPaG: psi(140), ambientC: 30 },
        { at: day(-5), dischargeKPaG: psi(125), ambientC: 30 },
      ],
      [day(-60)],
      settings,
    );
    expect(health.flag).toBe('ok');
  });

  it('says "within 3 K" only when the approach is within 3 K, and states a larger rise with its sign', () => {
    expect(approachDriftWords(1.24, -3)).toBe('is within 3 K of its post-charge baseline (+1.2 K)');
    expect(approachDriftWords(-2.96, -3)).toBe('is within 3 K of its post-charge baseline (−3 K)');
    expect(approachDriftWords(5.9, -3)).toBe(
      'is +5.9 K from its post-charge baseline: higher, not a sign of lost charge',
    );
    expect(approachDriftWords(8.24, -3)).not.toContain('within');
  });

  it('explains a rise of the approach above the baseline without calling it "within"', () => {
    const { health } = assessPressureHealth(
      'R-134a',
      [
        { at: day(-60), dischargeKPaG: psi(125), ambientC: 30 },
        { at: day(-5), dischargeKPaG: psi(140), ambientC: 30 },
      ],
      [day(-60)],
    );
    expect(health.flag).toBe('ok');
    expect(health.explanation).toBe(
      'The condenser approach is +3.8 K from its post-charge baseline: higher, not a sign of lost charge.',
    );
  });

  it('refuses a reading below a perfect vacuum', () => {
    expect(() => assessPressureHealth('R-134a', [{ at: day(-1), suctionKPaG: -150 }], [])).toThrow(DomainError);
    expect(() => assessPressureHealth('R-134a', [{ at: 'soon', suctionKPaG: 10 }], [])).toThrow(/not a valid date/);
  });

  it('uses commissioning as the first baseline in the unit statistics', () => {
    // Our definition: a new unit is fully charged at commissioning
    const s = computeUnitStats(
      { refrigerant: 'R-134a', nominalChargeKg: 5, commissionedOn: day(-100) },
      [
        { kind: 'pressure', at: day(-95), dischargeKPaG: psi(140), ambientC: 30 },
        { kind: 'pressure', at: day(-1), dischargeKPaG: psi(125), ambientC: 30, sightGlass: 'full' },
      ],
      D,
    );
    expect(s.pressureHealth.flag).toBe('possible_low_charge');
    expect(s.snapshots).toHaveLength(2);
    expect(s.snapshots[1].driftK).toBeCloseTo(-3.8, 2);
  });
});
