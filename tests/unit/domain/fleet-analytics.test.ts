import { describe, expect, it } from 'vitest';
import { emissionsByMonth, fleetRepairsAt, repairEffectiveness, type UnitHistory } from '../../../shared/domain';
import { settingsSchema } from '../../../shared/schemas/settings';
import { D, day } from './helpers';

const repairAt = (k: number, location: 'service_valve' | 'brazed_joint' = 'service_valve') =>
  ({
    kind: 'repair',
    at: day(k),
    location,
    action: location === 'service_valve' ? 'valve_core_replaced' : 'rebrazed',
    verified: true,
  }) as const;

describe('repair effectiveness', () => {
  // Our worked example: six units, each with a service-valve repair on D−400.
  // Units 1–2 need a top-up 100 days later (recurred); unit 3 a top-up 200 days later (held: beyond 180 days);
  // units 4–6 nothing. → 6 repairs, 4 held → 66.7 %. Three brazed-joint repairs (all held) → rate hidden (< 5).
  // One more repair on D−50 is too recent to judge.
  const histories: UnitHistory[] = [
    { refrigerant: 'R-134a', events: [repairAt(-400), { kind: 'top_up', at: day(-300), kg: 0.5 }] },
    { refrigerant: 'R-134a', events: [repairAt(-400), { kind: 'leak_check', at: day(-300), leakFound: true }] },
    { refrigerant: 'R-134a', events: [repairAt(-400), { kind: 'top_up', at: day(-200), kg: 0.5 }] },
    { refrigerant: 'R-134a', events: [repairAt(-400), repairAt(-390, 'brazed_joint')] },
    { refrigerant: 'R-404A', events: [repairAt(-400), repairAt(-390, 'brazed_joint')] },
    { refrigerant: 'R-404A', events: [repairAt(-400), repairAt(-390, 'brazed_joint'), repairAt(-50)] },
  ];

  it('shows the share of repairs that held for 180 days', () => {
    // Our definition (DOMAIN.md §10)
    const r = repairEffectiveness(histories, D);
    const valve = r.rows.find((x) => x.location === 'service_valve' && x.action === 'valve_core_replaced');
    expect(valve).toMatchObject({ repairs: 6, held: 4, recurred: 2, pending: 1, holdRatePct: 66.7 });
    const brazed = r.rows.find((x) => x.location === 'brazed_joint');
    expect(brazed).toMatchObject({ repairs: 3, held: 3, holdRatePct: null });
    expect(r).toMatchObject({ holdDays: 180, minRepairs: 5 });
    expect(fleetRepairsAt(r, 'service_valve')).toEqual({ repairs: 6, recurred: 2 });
    expect(fleetRepairsAt(r, 'compressor')).toEqual({ repairs: 0, recurred: 0 });
  });

  it('judges a recent repair as soon as it leaks again', () => {
    const r = repairEffectiveness(
      [{ refrigerant: 'R-134a', events: [repairAt(-20), { kind: 'top_up', at: day(-5), kg: 0.3 }] }],
      D,
    );
    expect(r.rows[0]).toMatchObject({ repairs: 1, recurred: 1, pending: 0 });
  });

  it('follows the minimum repair count in settings', () => {
    const r = repairEffectiveness(histories, D, settingsSchema.parse({ economics: { minRepairsForRate: 3 } }));
    expect(r.rows.find((x) => x.location === 'brazed_joint')?.holdRatePct).toBe(100);
  });

  it('groups repairs without a location or action on their own', () => {
    const r = repairEffectiveness(
      [{ refrigerant: 'R-134a', events: [{ kind: 'repair', at: day(-400), verified: false }] }],
      D,
    );
    expect(r.rows[0]).toMatchObject({ location: null, action: null, repairs: 1, held: 1 });
  });
});

describe('emissions per month, site and refrigerant', () => {
  it('multiplies made-up kg by the AR4 GWP', () => {
    // Source: IPCC AR4 GWPs (R-134a 1430; R-404A 3922 per Reg. (EU) 2024/573 Annex VI method). Our arithmetic:
    // R-134a at site A in Jan 2025: 1.0 + 0.5 = 1.5 kg → 1.5 × 1430 / 1000 = 2.145 t
    // R-134a at site B in Jan 2025: 0.25 kg → 0.3575 t; R-404A (unit site C) in Feb 2025: 2 kg → 7.844 t
    const rows = emissionsByMonth([
      {
        refrigerant: 'R-134a',
        site: 'A',
        events: [
          { kind: 'top_up', at: '2025-01-05', kg: 1.0, site: 'A' },
          { kind: 'top_up', at: '2025-01-20', kg: 0.5 },
          { kind: 'top_up', at: '2025-01-25', kg: 0.25, site: 'B' },
          { kind: 'leak_check', at: '2025-01-26', leakFound: false, site: 'B' },
        ],
      },
      { refrigerant: 'R-404A', site: 'C', events: [{ kind: 'top_up', at: '2025-02-10T10:00:00Z', kg: 2 }] },
    ]);
    expect(rows).toEqual([
      { month: '2025-01', site: 'A', refrigerant: 'R-134a', madeUpKg: 1.5, co2eTonnes: 2.145 },
      { month: '2025-01', site: 'B', refrigerant: 'R-134a', madeUpKg: 0.25, co2eTonnes: 0.3575 },
      { month: '2025-02', site: 'C', refrigerant: 'R-404A', madeUpKg: 2, co2eTonnes: 7.844 },
    ]);
  });

  it('keeps to a date range and the AR5 basis when asked', () => {
    // Our arithmetic: only the Feb visit is in range; 1 kg × 1300 (AR5) / 1000 = 1.3 t
    const rows = emissionsByMonth(
      [
        {
          refrigerant: 'R-134a',
          events: [
            { kind: 'top_up', at: '2025-01-05', kg: 1 },
            { kind: 'top_up', at: '2025-02-05', kg: 1 },
            { kind: 'top_up', at: '2025-03-05', kg: 1 },
          ],
        },
      ],
      { basis: 'AR5', from: '2025-02-01', to: '2025-02-28' },
    );
    expect(rows).toEqual([{ month: '2025-02', site: null, refrigerant: 'R-134a', madeUpKg: 1, co2eTonnes: 1.3 }]);
  });
});
