import { format, formatDistanceStrict, parseISO } from 'date-fns';
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

export const UNIT_STATUS_WORDS: Record<string, string> = {
  in_service: 'In service',
  out_of_service: 'Out of service',
  retired: 'Retired',
};

const toDate = (v: string | Date) => (typeof v === 'string' ? parseISO(v) : v);

export const fmtDay = (v: string | Date) => format(toDate(v), 'd MMM yyyy');
export const fmtDayShort = (v: string | Date) => format(toDate(v), 'd MMM');
export const fmtDateTime = (v: string | Date) => format(toDate(v), 'd MMM yyyy, HH:mm');
export const fmtSpan = (from: string | Date, to: string | Date) => formatDistanceStrict(toDate(from), toDate(to));

/** Trims trailing zeros: 0.80 → "0.8", 12 → "12". */
export function fmtNumber(value: number, maxDecimals = 2): string {
  return new Intl.NumberFormat('en-GB', { maximumFractionDigits: maxDecimals }).format(value);
}

export function fmtKg(kg: number): string {
  return `${fmtNumber(kg, kg < 10 ? 2 : 1)} kg`;
}

export const fmtPct = (pct: number) => `${fmtNumber(pct, pct < 10 ? 1 : 0)} %`;
export const fmtC = (c: number) => `${c < 0 ? '−' : ''}${fmtNumber(Math.abs(c), 1)} °C`;
export const fmtK = (k: number) => `${k > 0 ? '+' : k < 0 ? '−' : ''}${fmtNumber(Math.abs(k), 1)} K`;

/** Axis tick: the year at a year's start, else the month (long spans) or the day (short ones). */
export function timeTick(d: Date | { valueOf(): number }, spanDays: number): string {
  const date = d instanceof Date ? d : new Date(d.valueOf());
  if (date.getMonth() === 0 && date.getDate() === 1 && date.getHours() === 0) return String(date.getFullYear());
  if (spanDays > 120) return format(date, 'MMM');
  return format(date, 'd MMM');
}
