import { describe, expect, it } from 'vitest';
import { ALERT_KINDS, ROLE_ALERT_DEFAULTS, type SubscriptionsDto } from '../../shared/schemas/alerts';
import type { Role } from '../../shared/permissions';
import {
  backToDefault,
  defaultSentence,
  initialChoices,
  mySitesSentence,
  scopeWords,
  setAllSites,
  toggleSite,
  toInput,
} from '../../src/features/alerts/utils/subscription-choices';

const sites = [
  { id: 1, code: 'AAA', name: 'Alder Wharf' },
  { id: 2, code: 'BBB', name: 'Birch Pier' },
];

function dto(role: Role, mySiteIds: number[] = []): SubscriptionsDto {
  const kinds = ALERT_KINDS.map((kind) => ({
    kind,
    scope: 'default' as const,
    defaultReach: ROLE_ALERT_DEFAULTS[role][kind] ?? null,
  }));
  const subscriptions = kinds.flatMap(({ kind, defaultReach }) =>
    (defaultReach === 'all_sites' ? sites.map((s) => s.id) : defaultReach === 'my_sites' ? mySiteIds : []).map(
      (siteId) => ({ siteId, kind }),
    ),
  );
  return { sites, subscriptions, kinds, role, mySiteIds };
}

describe('the alert settings in words', () => {
  it('tells each role what it gets until it chooses', () => {
    expect(defaultSentence(dto('engineer', [1]))).toBe(
      'As a fleet engineer you get every alert below for your sites unless you change it.',
    );
    expect(defaultSentence(dto('owner'))).toBe(
      'As an owner you get “Chronic leakers” for every site unless you change it.',
    );
    expect(defaultSentence(dto('admin'))).toBe(
      'As an administrator you get “Leak rate over the threshold” for every site unless you change it.',
    );
    expect(mySitesSentence(dto('engineer', [2]))).toMatch(/last 90 days: Birch Pier\.$/);
    expect(mySitesSentence(dto('engineer'))).toMatch(/none yet/);
    expect(mySitesSentence(dto('owner'))).toBeNull();
  });
});

describe('the alert settings choices', () => {
  it('sends "all sites", back-to-default and ticked kinds apart, and a ticked box leaves the default', () => {
    const data = dto('engineer', [1]);
    let c = initialChoices(data);
    expect(scopeWords(c, data, 'digest')).toBe('Your default: your sites (1 site).');
    c = setAllSites(c, 'digest', true);
    c = toggleSite(c, 2, 'chronic');
    expect(scopeWords(c, data, 'digest')).toBe('Every site, also sites added later.');
    expect(scopeWords(c, data, 'chronic')).toBe('2 sites you chose.');
    expect(toInput(c)).toEqual({
      subscriptions: expect.arrayContaining([
        { siteId: 1, kind: 'chronic' },
        { siteId: 2, kind: 'chronic' },
      ]),
      allSites: ['digest'],
      useDefaults: ['leak_rate', 'open_leak', 'recheck'],
    });
    expect(toInput(c).subscriptions).toHaveLength(2);
    c = backToDefault(setAllSites(c, 'digest', false), data, 'digest');
    expect(toInput(c).useDefaults).toContain('digest');
    c = toggleSite(toggleSite(c, 1, 'chronic'), 2, 'chronic');
    expect(scopeWords(c, data, 'chronic')).toBe('Off: no sites chosen.');
  });
});
