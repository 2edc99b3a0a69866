import type { ScoreBand } from '../../shared/domain';

/**
 * The repeat-leak score's three bands in our own words, used by every screen. The engine's ids stay internal; the
 * words, the tile colours and the loop glyph (closed, opened, broken) carry the meaning together.
 */
export const SCORE_BAND_WORDS: Record<ScoreBand, { label: string; blurb: string }> = {
  tight: { label: 'Holding', blurb: 'The loop holds its charge.' },
  watch: { label: 'Slipping', blurb: 'Losing refrigerant; watch the next visits.' },
  chronic: { label: 'Repeat leaker', blurb: 'Leaks again and again; a proper repair or a decision is due.' },
};
