import type { ReactNode } from 'react';
import { DECISION_CHOICE_LABELS, type StoredDecisionDetails } from '../../../../shared/schemas/decisions';
import { decisionAssumptionLines } from '../../../../shared/domain/words';
import { fmtMoney } from '../../../lib/format';

/** A recorded decision in the history: the option chosen, every option's cost as priced that day, and what it assumed. */
export function decisionRows(
  details: Record<string, unknown>,
  Detail: (p: { label: string; children: ReactNode }) => ReactNode,
): ReactNode[] {
  const d = details as StoredDecisionDetails;
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
  if (d.assumptions) {
    // The same words and units as the decision page and the handover PDF, folded: a phone shows fourteen lines.
    const lines = decisionAssumptionLines(d.assumptions, d.currency);
    rows.push(
      <Detail key="assumptions" label="Assumed">
        <details>
          <summary className="cursor-pointer py-2.5">
            {lines.length} {lines.length === 1 ? 'figure' : 'figures'}
            {d.settingsVersion != null ? `, settings version ${d.settingsVersion}` : ''}
          </summary>
          <ul className="mt-1 font-normal">
            {lines.map((line) => (
              <li key={line}>{line}</li>
            ))}
          </ul>
        </details>
      </Detail>,
    );
  }
  return rows;
}
