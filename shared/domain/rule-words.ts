// What a leak check or re-check is asked for, in the words of the rule the unit's site follows (EU, US reference, or
// the company's own): alerts, mails and My day say the site's rule, never one text for the whole fleet.
import { fmtIsoDay } from '../format-dates';

export type SiteRule = 'EU' | 'US' | 'custom';

const months = (n: number) => (n === 1 ? 'month' : `${n} months`);
const daysText = (n: number) => (n === 1 ? 'the day after' : n === 0 ? 'on the same day as' : `${n} days after`);

/** The periodic leak check the site's rule asks of this unit, in a sentence. */
export function leakCheckRuleWords(rule: SiteRule, intervalMonths: number | null | undefined): string {
  switch (rule) {
    case 'EU':
      // Source: Regulation (EU) 2024/573, Art. 5 (intervals by t CO2e of the full charge).
      return intervalMonths
        ? `EU Regulation 2024/573 asks for a leak check every ${months(intervalMonths)} for this unit's charge.`
        : "EU Regulation 2024/573 asks for no periodic leak check for this unit's charge.";
    case 'US':
      // Source: 40 CFR 82.157 (reference only: federal duties start at 15 lb of HFC full charge).
      return intervalMonths
        ? `The US reference rule (40 CFR 82.157) has a leak inspection every ${months(intervalMonths)} while the leak rate is over the threshold — a reference line, not a duty, for a unit this size.`
        : 'The US reference rule (40 CFR 82.157) asks for no periodic leak inspection of this unit now.';
    default:
      return intervalMonths
        ? `Your company's rule asks for a leak check every ${months(intervalMonths)} for this unit's charge.`
        : "Your company's rule asks for no periodic leak check for this unit's charge.";
  }
}

/** "Leak check overdue since 3 Mar 2026." or "Leak check due on 3 Mar 2026.", then the site's rule. */
export function leakCheckDueWords(
  rule: SiteRule,
  c: { dueOn: string; today: string; intervalMonths?: number | null },
): string {
  const when =
    c.dueOn < c.today ? `Leak check overdue since ${fmtIsoDay(c.dueOn)}.` : `Leak check due on ${fmtIsoDay(c.dueOn)}.`;
  return `${when} ${leakCheckRuleWords(rule, c.intervalMonths)}`;
}

/** Why a re-check follows a top-up or a repair, by the site's rule, with the fleet's interval in days (settings). */
export function recheckRuleWords(rule: SiteRule, reason: 'top_up' | 'repair', days: number): string {
  if (reason === 'top_up') {
    // Common practice, no published source: the technician comes back the next day to see that the charge held.
    return rule === 'custom'
      ? `Your company's rule: a re-check ${daysText(days)} a top-up, to see that the charge held.`
      : `Common practice (no regulation sets it): a re-check ${daysText(days)} a top-up, to see that the charge held.`;
  }
  switch (rule) {
    case 'EU':
      // Source: Regulation (EU) 2024/573 — a leak check within one month of a repair.
      return `EU Regulation 2024/573 asks for a leak check within one month of a repair; this fleet's re-check falls ${days} days after it.`;
    case 'US':
      // Source: 40 CFR 82.157 (reference only): a repair is followed by verification tests.
      return `The US reference rule (40 CFR 82.157) follows a repair with verification tests; this fleet's re-check falls ${days} days after it.`;
    default:
      return `Your company's rule: a leak check ${days} days after a repair.`;
  }
}

/** The site's leak-check rule in a few words, for a list row: "EU 2024/573: every 12 months". */
export function leakCheckRuleShort(rule: SiteRule, intervalMonths: number | null | undefined): string {
  const every = intervalMonths ? `every ${months(intervalMonths)}` : 'no periodic check';
  if (rule === 'EU') return `EU 2024/573: ${every}`;
  if (rule === 'US') return `US reference (40 CFR 82.157): ${every}`;
  return `your company's rule: ${every}`;
}

/** A list row's reason: "Leak check overdue since 4 Mar 2026 — EU 2024/573: every 12 months." */
export function leakCheckDueShort(
  rule: SiteRule,
  c: { dueOn: string; today: string; intervalMonths?: number | null },
): string {
  const when =
    c.dueOn < c.today ? `Leak check overdue since ${fmtIsoDay(c.dueOn)}` : `Leak check due on ${fmtIsoDay(c.dueOn)}`;
  return `${when} — ${leakCheckRuleShort(rule, c.intervalMonths)}.`;
}

/** Why a repair is followed by a leak check, in a few words, by the site's rule. */
export function repairRecheckShort(rule: SiteRule, days: number): string {
  // Source: Regulation (EU) 2024/573 — a leak check within one month of a repair.
  if (rule === 'EU') return 'EU 2024/573: a leak check within a month of a repair';
  // Source: 40 CFR 82.157 (reference only): verification tests after a repair.
  if (rule === 'US') return 'US reference (40 CFR 82.157): verification after a repair';
  return `your company's rule: a leak check ${days} days after a repair`;
}
