import { describe, expect, it } from 'vitest';
import { leakCheckDueWords, recheckRuleWords } from '../../../shared/domain/rule-words';

describe('leak-check and re-check words by the site’s rule', () => {
  const overdue = { dueOn: '2026-03-04', today: '2026-03-10', intervalMonths: 12 };

  it('cites the EU regulation’s interval at an EU site', () => {
    // Source: Regulation (EU) 2024/573, Art. 5 — leak checks by t CO2e; a re-check within one month of a repair.
    expect(leakCheckDueWords('EU', overdue)).toBe(
      "Leak check overdue since 4 Mar 2026. EU Regulation 2024/573 asks for a leak check every 12 months for this unit's charge.",
    );
    expect(recheckRuleWords('EU', 'repair', 30)).toContain(
      'EU Regulation 2024/573 asks for a leak check within one month of a repair',
    );
  });

  it('states the US reference rule as a reference at a US site', () => {
    // Source: 40 CFR 82.157 — leak inspections and verification after a repair; used here as a reference only.
    const words = leakCheckDueWords('US', { ...overdue, dueOn: '2026-03-20' });
    expect(words).toMatch(/^Leak check due on 20 Mar 2026\. The US reference rule \(40 CFR 82\.157\)/);
    expect(words).toContain('not a duty');
    expect(words).not.toContain('EU');
    expect(recheckRuleWords('US', 'repair', 30)).toContain('40 CFR 82.157');
  });

  it('speaks of the company’s own rule at a custom site', () => {
    // Common practice, no published source: a re-check the day after a top-up to see that the charge held.
    const words = leakCheckDueWords('custom', overdue);
    expect(words).toContain("Your company's rule asks for a leak check every 12 months");
    expect(words).not.toMatch(/EU|CFR/);
    expect(recheckRuleWords('custom', 'top_up', 1)).toBe(
      "Your company's rule: a re-check the day after a top-up, to see that the charge held.",
    );
    expect(recheckRuleWords('EU', 'top_up', 1)).toMatch(/^Common practice/);
  });
});
