// A cylinder's ledger: what it holds now, and whether the kilograms written on visits match what the scale says.
// [T] our own definitions (DOMAIN.md has none for cylinders); the tolerance and the near-full share are settings.
import { roundTo as round } from './numbers';

export type CylinderLedgerInput = {
  kind: 'new' | 'recovery';
  tareKg: number;
  /** The cylinder maker's marked maximum fill, kg of refrigerant. */
  capacityKg: number;
  weighings: readonly { at: string; grossKg: number }[];
  /** Visits' movements that are not voided: 'out' of the cylinder into a unit, 'in' from a unit. */
  moves: readonly { at: string; kg: number; direction: 'in' | 'out' }[];
};

export type CylinderLedgerOptions = { toleranceKg: number; nearFullPct: number };

export type CylinderReconciliation = {
  from: string;
  to: string;
  /** Net kilograms visits moved out of the cylinder between the two weighings (negative: into it). */
  visitsOutKg: number;
  /** Net kilograms the cylinder lost on the scale between the two weighings (negative: it gained). */
  weighedLossKg: number;
  /** weighedLossKg − visitsOutKg: more lost than written (positive) or less (negative). */
  differenceKg: number;
  flagged: boolean;
};

export type CylinderLedger = {
  /** Estimated refrigerant in the cylinder now; null when it was never weighed and holds supply gas. */
  contentKg: number | null;
  fillPct: number | null;
  nearFull: boolean;
  /** Kilograms moved by visits over the cylinder's whole record. */
  outKg: number;
  inKg: number;
  lastWeighedAt: string | null;
  reconciliation: CylinderReconciliation | null;
};

const byTime = <T extends { at: string }>(a: T, b: T) => Date.parse(a.at) - Date.parse(b.at);
const signed = (m: { kg: number; direction: 'in' | 'out' }) => (m.direction === 'in' ? m.kg : -m.kg);

/**
 * Reconciles visits against weighings over the span from the first to the latest weighing: a move counts when it
 * happened after the first weighing and no later than the latest one. Content is the latest net weight plus the
 * moves since; a recovery cylinder never weighed is taken to have started empty.
 */
export function cylinderLedger(c: CylinderLedgerInput, opts: CylinderLedgerOptions): CylinderLedger {
  const weighings = [...c.weighings].sort(byTime);
  const moves = [...c.moves].sort(byTime);
  const outKg = round(
    moves.filter((m) => m.direction === 'out').reduce((s, m) => s + m.kg, 0),
    3,
  );
  const inKg = round(
    moves.filter((m) => m.direction === 'in').reduce((s, m) => s + m.kg, 0),
    3,
  );
  const last = weighings.at(-1);
  let contentKg: number | null;
  if (last) {
    const since = moves.filter((m) => Date.parse(m.at) > Date.parse(last.at)).reduce((s, m) => s + signed(m), 0);
    contentKg = round(last.grossKg - c.tareKg + since, 3);
  } else {
    contentKg = c.kind === 'recovery' ? round(inKg - outKg, 3) : null;
  }
  let reconciliation: CylinderReconciliation | null = null;
  if (weighings.length >= 2) {
    const first = weighings[0];
    const from = Date.parse(first.at);
    const to = Date.parse(last!.at);
    const inSpan = moves.filter((m) => Date.parse(m.at) > from && Date.parse(m.at) <= to);
    const visitsOutKg = round(-inSpan.reduce((s, m) => s + signed(m), 0), 3);
    const weighedLossKg = round(first.grossKg - last!.grossKg, 3);
    const differenceKg = round(weighedLossKg - visitsOutKg, 3);
    reconciliation = {
      from: first.at,
      to: last!.at,
      visitsOutKg,
      weighedLossKg,
      differenceKg,
      // A hair over the tolerance in floating point is not a mismatch.
      flagged: Math.abs(differenceKg) > opts.toleranceKg + 1e-9,
    };
  }
  const fillPct = contentKg == null ? null : round((Math.max(0, contentKg) / c.capacityKg) * 100, 1);
  return {
    contentKg,
    fillPct,
    nearFull: c.kind === 'recovery' && fillPct != null && fillPct >= opts.nearFullPct,
    outKg,
    inKg,
    lastWeighedAt: last?.at ?? null,
    reconciliation,
  };
}

/**
 * Room left before the maker's marked maximum fill; a recovery that would pass it is refused. Common practice, no
 * published source: never fill a recovery cylinder beyond the maximum its maker marks on it.
 */
export function recoveryRoomKg(ledger: CylinderLedger, capacityKg: number): number {
  return round(capacityKg - Math.max(0, ledger.contentKg ?? ledger.inKg - ledger.outKg), 3);
}
