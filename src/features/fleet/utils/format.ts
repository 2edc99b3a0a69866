import { SCORE_BAND_WORDS } from '../../../config/score-bands';
import { formatContainerNumber } from '../../../../shared/domain';

export const fmtNumber = (v: number, digits = 1) =>
  v.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: 0 });
export const fmtPct = (v: number) => `${fmtNumber(v, 1)} %`;
export const fmtKg = (v: number) => `${fmtNumber(v, 2)} kg`;
export const fmtTonnes = (v: number) => `${fmtNumber(v, v < 10 ? 2 : 1)} t`;
/** 2026-06-01 → 1 Jun 2026 (UTC: dates in Tightloop are calendar days). */
export function fmtDay(iso: string | null | undefined): string {
  if (!iso) return '—';
  const d = new Date(`${iso.slice(0, 10)}T00:00:00Z`);
  return d.toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
}
export const fmtContainer = (n: string) => formatContainerNumber(n);
export const BAND_LABELS = {
  tight: SCORE_BAND_WORDS.tight.label,
  watch: SCORE_BAND_WORDS.watch.label,
  chronic: SCORE_BAND_WORDS.chronic.label,
} as const;
/** The unit's own page. */
export const unitHref = (id: number) => `/units/${id}`;
