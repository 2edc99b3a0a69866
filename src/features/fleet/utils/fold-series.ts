export type Stacked = { keys: string[]; byMonth: Map<string, Map<string, number>>; totals: Map<string, number> };

/**
 * At most `max` series, so each has a colour of its own: the largest `max − 1` (keys come largest first) and the rest
 * summed into one "other" series, drawn last. Monthly totals do not change.
 */
export function foldSmallSeries(stacked: Stacked, max: number, otherLabel: (count: number) => string): Stacked {
  if (stacked.keys.length <= max) return stacked;
  const top = stacked.keys.slice(0, max - 1);
  const rest = new Set(stacked.keys.slice(max - 1));
  const other = otherLabel(rest.size);
  const byMonth = new Map<string, Map<string, number>>();
  for (const [month, row] of stacked.byMonth) {
    const folded = new Map<string, number>();
    let sum = 0;
    for (const [k, v] of row) {
      if (rest.has(k)) sum += v;
      else folded.set(k, v);
    }
    if (sum > 0) folded.set(other, sum);
    byMonth.set(month, folded);
  }
  return { keys: [...top, other], byMonth, totals: stacked.totals };
}
