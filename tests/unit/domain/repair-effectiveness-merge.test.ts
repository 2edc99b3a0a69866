import { describe, expect, it } from 'vitest';
import { mergeRepairEffectiveness, repairEffectiveness, type UnitHistory } from '../../../shared/domain';
import { D, day } from './helpers';

const repairAt = (k: number) =>
  ({ kind: 'repair', at: day(k), location: 'service_valve', action: 'valve_core_replaced', verified: true }) as const;

describe('merging repair effectiveness over chunks of units', () => {
  // Our definition (DOMAIN.md §10): each repair is judged on its own unit's history, so disjoint groups add up.
  const histories: UnitHistory[] = [
    { refrigerant: 'R-134a', events: [repairAt(-400), { kind: 'top_up', at: day(-300), kg: 0.5 }] },
    { refrigerant: 'R-134a', events: [repairAt(-400), { kind: 'leak_check', at: day(-300), leakFound: true }] },
    { refrigerant: 'R-134a', events: [repairAt(-400), { kind: 'top_up', at: day(-200), kg: 0.5 }] },
    { refrigerant: 'R-134a', events: [repairAt(-400)] },
    { refrigerant: 'R-404A', events: [repairAt(-400)] },
    { refrigerant: 'R-404A', events: [repairAt(-400), repairAt(-50)] },
  ];

  it('gives the same rows as one pass over all units', () => {
    const whole = repairEffectiveness(histories, D);
    const merged = mergeRepairEffectiveness([
      repairEffectiveness(histories.slice(0, 2), D),
      repairEffectiveness(histories.slice(2, 3), D),
      repairEffectiveness(histories.slice(3), D),
    ]);
    expect(merged).toEqual(whole);
    // 6 judged repairs, 4 held → 66.7 %; the D−50 one is pending.
    expect(merged.rows[0]).toMatchObject({ repairs: 6, held: 4, recurred: 2, pending: 1, holdRatePct: 66.7 });
  });

  it('hides the rate while a chunk alone has fewer than five repairs, and shows it once the sum reaches five', () => {
    const parts = [repairEffectiveness(histories.slice(0, 3), D), repairEffectiveness(histories.slice(3, 5), D)];
    expect(parts[0].rows[0].holdRatePct).toBeNull();
    expect(mergeRepairEffectiveness(parts).rows[0]).toMatchObject({ repairs: 5, held: 3, holdRatePct: 60 });
  });

  it('returns empty rows for no parts', () => {
    expect(mergeRepairEffectiveness([])).toMatchObject({ rows: [], byLocation: [], holdDays: 180, minRepairs: 5 });
  });
});
