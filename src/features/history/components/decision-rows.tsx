import type { ReactNode } from 'react';
import { DECISION_CHOICE_LABELS, type DecisionChoice } from '../../../../shared/schemas/decisions';
import { fmtMoney, fmtNumber } from '../../../lib/format';

interface StoredOption {
  id: string;
  label: string;
  eac: number;
  npv: number;
}
interface StoredDecision {
  choice?: DecisionChoice;
  option?: string;
  cheapestId?: string;
  currency?: string;
  options?: StoredOption[];
  assumptions?: { discountRatePct?: number; remainingYears?: number; visitsPerYear?: number };
  settingsVersion?: number;
}

/** A recorded decision in the history: the option chosen, every option's cost as priced that day, and what it assumed. */
export function decisionRows(
  details: Record<string, unknown>,
  Detail: (p: { label: string; children: ReactNode }) => ReactNode,
): ReactNode[] {
  const d = details as StoredDecision;
  const rows: ReactNode[] = [];
  if (d.choice) {
    rows.push(
      <Detail key="choice" label="Chosen">
        {DECISION_CHOICE_LABELS[d.choice] ?? d.choice}
        {d.cheapestId && d.option && d.option !== d.cheapestId ? ' (not the cheapest)' : ''}
      </Detail>,
    );
  }
  for (const o of d.options ?? []) {
    rows.push(
      <Detail key={`o-${o.id}`} label={o.label}>
        {fmtMoney(o.eac, d.currency)} a year · {fmtMoney(o.npv, d.currency)} over the remaining life
        {o.id === d.option ? ' ← chosen' : ''}
      </Detail>,
    );
  }
  const a = d.assumptions;
  if (a) {
    const parts = [
      a.remainingYears != null ? `${fmtNumber(a.remainingYears, 1)} years left` : null,
      a.visitsPerYear != null ? `${fmtNumber(a.visitsPerYear, 1)} top-ups a year` : null,
      a.discountRatePct != null ? `${fmtNumber(a.discountRatePct, 1)} % discount rate` : null,
    ].filter(Boolean);
    rows.push(
      <Detail key="assumptions" label="Assumed">
        {parts.join(' · ')}
        {d.settingsVersion != null ? ` (settings version ${d.settingsVersion})` : ''}
      </Detail>,
    );
  }
  return rows;
}
