import type { UnitStatsDto, UnitStatsSummary } from '../../../../shared/schemas/history';

/** `stats.detail` is the engine's result without its series (shared/domain computeUnitStats); read-only. */
export function statsDetail(stats: UnitStatsDto | null | undefined): UnitStatsSummary | null {
  const d = stats?.detail;
  if (!d || typeof d !== 'object' || !('score' in d) || !('pressureHealth' in d)) return null;
  return d;
}
