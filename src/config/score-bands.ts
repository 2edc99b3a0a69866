// The repeat-leak score's bands in our own words: the one map in shared, also used by the exports and mails.
export { SCORE_BAND_WORDS } from '../../shared/domain/words';
