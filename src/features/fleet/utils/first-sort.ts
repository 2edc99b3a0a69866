import type { FleetSort } from '../../../../shared/schemas/fleet';

/**
 * The order a column sorts in at its first click: what people look for first. Dates ahead (next top-up, leak check
 * due, PTI valid until) soonest first, container numbers A→Z; score, leak rate and CO2e worst first.
 */
const FIRST: Record<FleetSort, 'asc' | 'desc'> = {
  forecast: 'asc',
  leakCheck: 'asc',
  pti: 'asc',
  containerNumber: 'asc',
  score: 'desc',
  rate: 'desc',
  co2e: 'desc',
};

/** The next order of `column` on a click: its first order when another column was sorted, else the other way. */
export function nextSort(column: FleetSort, current: { sort: FleetSort; dir: 'asc' | 'desc' }): 'asc' | 'desc' {
  if (current.sort !== column) return FIRST[column];
  return current.dir === 'asc' ? 'desc' : 'asc';
}
