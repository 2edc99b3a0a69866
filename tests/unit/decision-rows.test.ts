import { createElement, Fragment, type ReactNode } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { compareRepairOptions } from '../../shared/domain';
import { decisionAssumptionLines } from '../../shared/domain/words';
import { DEFAULT_SETTINGS } from '../../shared/schemas/settings';
import { decisionRows } from '../../src/features/history/components/decision-rows';

const Detail = ({ label, children }: { label: string; children: ReactNode }) =>
  createElement('div', null, `${label}: `, children);

describe('a decision in the history', () => {
  it('shows the option chosen, every option priced that day and the assumptions with their settings version', () => {
    const result = compareRepairOptions(
      {
        refrigerant: 'R-134a',
        ageYears: 6,
        topUpIntervalDays: 120,
        madeUpKgPerVisit: 0.8,
        leakLocation: 'service_valve',
      },
      DEFAULT_SETTINGS,
    );
    const details = {
      choice: 'repair',
      option: 'repair',
      cheapestId: result.cheapestId,
      currency: result.currency,
      options: result.options,
      assumptions: result.assumptions,
      settingsVersion: 7,
    };
    const html = renderToStaticMarkup(createElement(Fragment, null, ...decisionRows(details, Detail)));
    expect(html).toContain('Chosen: Repair the leak');
    for (const o of result.options) expect(html).toContain(`${o.label}: `);
    expect(html).toContain('← chosen');
    expect(html).toContain('figures, settings version 7');
    // Every assumption in the shared words the handover PDF uses, one line each.
    for (const line of decisionAssumptionLines(result.assumptions, result.currency))
      expect(html).toContain(`<li>${line}</li>`);
    expect(html).toContain('<li>Top-ups a year: ');
    expect(html).toContain('<li>Leak to repair: Service valve</li>');
  });

  it('shows nothing it was not given (an old decision with only a note)', () => {
    expect(decisionRows({}, Detail)).toEqual([]);
  });
});
