import type { UnitStats } from '../../../../shared/domain';
import type { UnitStatsDto } from '../../../../shared/schemas/history';

/** `stats.detail` is the engine's whole result (shared/domain computeUnitStats); typed here, read-only. */
export function statsDetail(stats: UnitStatsDto | null | undefined): UnitStats | null {
  const d = stats?.detail;
  if (!d || typeof d !== 'object' || !('score' in d) || !('visits' in d)) return null;
  return d as unknown as UnitStats;
}
