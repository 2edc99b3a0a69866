import type { ScoreBand } from '../../../../shared/domain';
import { SCORE_BAND_WORDS } from '../../../config/score-bands';
import type { VisitEventKind } from '../../../../shared/schemas/history';
import { ENTRY_KIND_WORDS } from '../../../../shared/domain/words';

/** What each kind of entry is called in Tightloop (the one map in shared, also used by the exports). */
export const ENTRY_KIND_LABELS: Record<VisitEventKind, string> = ENTRY_KIND_WORDS;

export function entryKindLabel(kind: string): string {
  return (ENTRY_KIND_LABELS as Record<string, string>)[kind] ?? kind;
}

export const BAND_LABELS = SCORE_BAND_WORDS;

export const BAND_TONES: Record<ScoreBand, string> = {
  tight: 'border-fjord-700 bg-fjord-50 text-fjord-900',
  watch: 'border-heed-800 bg-heed-50 text-heed-800',
  chronic: 'border-alarm-700 bg-alarm-50 text-alarm-700',
};
