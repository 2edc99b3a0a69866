import type { ScoreBand } from '../../../../shared/domain';
import { SCORE_BAND_WORDS } from '../../../config/score-bands';
import type { VisitEventKind } from '../../../../shared/schemas/history';

/** What each kind of entry is called in Tightloop. */
export const ENTRY_KIND_LABELS: Record<VisitEventKind, string> = {
  top_up: 'Top-up',
  recovery: 'Recovery',
  recharge: 'Recharge',
  leak_check: 'Leak check',
  repair: 'Repair',
  pressure: 'Pressure reading',
  pti: 'PTI',
  component_replacement: 'Part replaced',
  status_change: 'Status change',
  note: 'Note',
};

export function entryKindLabel(kind: string): string {
  return (ENTRY_KIND_LABELS as Record<string, string>)[kind] ?? kind;
}

export const BAND_LABELS = SCORE_BAND_WORDS;

export const BAND_TONES: Record<ScoreBand, string> = {
  tight: 'border-fjord-700 bg-fjord-50 text-fjord-900',
  watch: 'border-heed-800 bg-heed-50 text-heed-800',
  chronic: 'border-alarm-700 bg-alarm-50 text-alarm-700',
};
