import { describe, expect, it } from 'vitest';
import { foldSmallSeries } from '../../src/features/fleet/utils/fold-series';

const site = (i: number) => `Site ${String(i).padStart(2, '0')}`;

describe('the overview chart’s series', () => {
  it('keeps the nine largest of 21 sites and sums the rest into "Other sites", monthly totals unchanged', () => {
    const keys = Array.from({ length: 21 }, (_, i) => site(i)); // largest first
    const row = new Map(keys.map((k, i) => [k, 21 - i]));
    const total = [...row.values()].reduce((a, b) => a + b, 0);
    const folded = foldSmallSeries(
      { keys, byMonth: new Map([['2026-05', row]]), totals: new Map([['2026-05', total]]) },
      10,
      (n) => `Other sites (${n})`,
    );
    expect(folded.keys).toEqual([...keys.slice(0, 9), 'Other sites (12)']);
    const may = folded.byMonth.get('2026-05')!;
    expect(may.get('Other sites (12)')).toBe(12 + 11 + 10 + 9 + 8 + 7 + 6 + 5 + 4 + 3 + 2 + 1);
    expect([...may.values()].reduce((a, b) => a + b, 0)).toBe(total);
    expect(folded.totals.get('2026-05')).toBe(total);
  });

  it('leaves ten or fewer series as they are', () => {
    const stacked = { keys: ['A', 'B'], byMonth: new Map(), totals: new Map() };
    expect(foldSmallSeries(stacked, 10, () => 'Other')).toBe(stacked);
  });
});
