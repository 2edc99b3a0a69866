import { describe, expect, it } from 'vitest';
import { PTI_ITEMS, ptiBlockers, ptiOverall, type PtiItemResult } from '../../../shared/domain/pti';
import { quarantineFromHistory } from '../../../shared/domain/quarantine';

const all = (result: PtiItemResult['result']): PtiItemResult[] => PTI_ITEMS.map((i) => ({ id: i.id, result }));

describe('structured PTI', () => {
  it('lists the pre-trip steps in the trade’s words, grouped as visual, electrical and controller, refrigeration', () => {
    // Common practice, no published source: the usual pre-trip steps of a reefer depot.
    expect(PTI_ITEMS.map((i) => i.group)).toEqual(expect.arrayContaining(['visual', 'electrical', 'refrigeration']));
    expect(PTI_ITEMS.map((i) => i.id)).toEqual(
      expect.arrayContaining(['pull_down', 'pressures', 'sight_glass', 'defrost', 'probes', 'self_test']),
    );
  });

  it('passes only when every item passed', () => {
    expect(ptiOverall(all('passed'))).toBe('passed');
  });

  it('fails when any item failed', () => {
    const items = all('passed');
    items[2] = { ...items[2], result: 'failed' };
    expect(ptiOverall(items)).toBe('failed');
  });

  it('is incomplete when an item was not done and none failed', () => {
    const items = all('passed');
    items[0] = { ...items[0], result: 'not_done' };
    expect(ptiOverall(items)).toBe('incomplete');
  });

  it('names every reason a PTI may not pass: open leak, low charge, quarantine, failed item', () => {
    const items = all('passed');
    items[4] = { ...items[4], result: 'failed' };
    const b = ptiBlockers({
      items,
      openLeakFoundAt: '2025-06-01T10:00:00Z',
      pressureFlag: 'possible_low_charge',
      quarantined: true,
    });
    expect(b.map((x) => x.code)).toEqual(['open_leak', 'low_charge', 'quarantine', 'failed_item']);
    expect(b.every((x) => x.words.length > 10)).toBe(true);
  });

  it('writes the day of an open leak the app’s way on the unit’s re-check panel (1 Jun 2025, not 2025-06-01)', () => {
    const [leak] = ptiBlockers({ openLeakFoundAt: '2025-06-01T10:00:00Z', pressureFlag: 'ok', quarantined: false });
    expect(leak.words).toBe('A leak found on 1 Jun 2025 has not been repaired.');
  });

  it('has nothing against a clean unit with every item passed', () => {
    expect(
      ptiBlockers({ items: all('passed'), openLeakFoundAt: null, pressureFlag: 'ok', quarantined: false }),
    ).toEqual([]);
  });
});

describe('quarantine from the history', () => {
  it('starts at the first mark and ends at a lift with its result', () => {
    const q = quarantineFromHistory([
      { id: 1, at: '2025-06-01T10:00:00Z', details: { quarantine: { reason: 'Suspect cylinder C-17' } } },
      { id: 2, at: '2025-06-02T10:00:00Z', details: { quarantine: { reason: 'Second mark' } } },
    ]);
    expect(q).toMatchObject({ since: '2025-06-01T10:00:00Z', reason: 'Suspect cylinder C-17', eventId: 1, marks: 2 });
    expect(
      quarantineFromHistory([
        { id: 1, at: '2025-06-01T10:00:00Z', details: { quarantine: { reason: 'Suspect cylinder C-17' } } },
        { id: 3, at: '2025-06-03T10:00:00Z', details: { quarantineLifted: { result: 'identified_pure' } } },
      ]),
    ).toBeNull();
  });

  it('takes a mark after a lift as a new quarantine', () => {
    const q = quarantineFromHistory([
      { id: 1, at: '2025-06-01T10:00:00Z', details: { quarantine: { reason: 'A' } } },
      { id: 2, at: '2025-06-03T10:00:00Z', details: { quarantineLifted: { result: 'recovered_recharged' } } },
      { id: 3, at: '2025-06-05T10:00:00Z', details: { quarantine: { reason: 'B' } } },
    ]);
    expect(q).toMatchObject({ since: '2025-06-05T10:00:00Z', reason: 'B', eventId: 3 });
  });
});
