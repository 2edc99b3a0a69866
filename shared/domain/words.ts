// The words people read for the product's internal codes: one map, used by the screens, the CSV exports and the mails,
// so an export never says `chronic` where the screen says "Repeat leaker". A unit's status words are
// UNIT_STATUS_LABELS in shared/schemas/units.ts.
import type { ScoreBand, ScoreFactorName } from './score';
import type { PressureFlag } from './pressure-health';

/** The repeat-leak score's three bands in our own words; the engine's ids stay internal. */
export const SCORE_BAND_WORDS: Record<ScoreBand, { label: string; blurb: string }> = {
  tight: { label: 'Holding', blurb: 'The loop holds its charge.' },
  watch: { label: 'Slipping', blurb: 'Losing refrigerant; watch the next visits.' },
  chronic: { label: 'Repeat leaker', blurb: 'Leaks again and again; a proper repair or a decision is due.' },
};

/** What each kind of entry in a unit's history is called. */
export const ENTRY_KIND_WORDS = {
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
  decision: 'Decision',
} as const;

/** The four reasons a repeat-leak score is made of. */
export const SCORE_FACTOR_WORDS: Record<ScoreFactorName, string> = {
  rate: 'Leak rate',
  count: 'Repeated top-ups',
  afterRepair: 'Back after a repair',
  sameSpot: 'Same spot again',
};

export const PRESSURE_FLAG_WORDS: Record<PressureFlag, string> = {
  ok: 'Charge looks right',
  possible_low_charge: 'Possible low charge',
  unknown: 'Not enough readings',
};

/** The word for a code of `map`; a code the map does not know is shown as it is rather than hidden. */
export function wordFor<M extends Record<string, string>>(map: M, code: string): string {
  return (map as Record<string, string>)[code] ?? code;
}
