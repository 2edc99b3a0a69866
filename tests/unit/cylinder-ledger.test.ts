// The cylinder ledger (shared/domain/cylinders.ts). Our own definitions [T]: no published rule to cite.
import { describe, expect, it } from 'vitest';
import { cylinderLedger, recoveryRoomKg } from '../../shared/domain/cylinders';

const opts = { toleranceKg: 0.5, nearFullPct: 90 };

describe('cylinderLedger', () => {
  it('matches visits against the scale between the first and the latest weighing', () => {
    const l = cylinderLedger(
      {
        kind: 'new',
        tareKg: 12,
        capacityKg: 13.6,
        weighings: [
          { at: '2026-03-01T00:00:00Z', grossKg: 25.6 },
          { at: '2026-04-01T00:00:00Z', grossKg: 23.1 },
        ],
        moves: [
          // Before the first weighing: already out of the cylinder when it was weighed.
          { at: '2026-02-20T00:00:00Z', kg: 9, direction: 'out' },
          { at: '2026-03-10T00:00:00Z', kg: 1.2, direction: 'out' },
          { at: '2026-03-20T00:00:00Z', kg: 1.1, direction: 'out' },
          // After the latest weighing: counts toward the content, not the reconciliation.
          { at: '2026-04-05T00:00:00Z', kg: 0.5, direction: 'out' },
        ],
      },
      opts,
    );
    expect(l.reconciliation).toMatchObject({ visitsOutKg: 2.3, weighedLossKg: 2.5, differenceKg: 0.2, flagged: false });
    expect(l.contentKg).toBe(10.6);
    expect(l.outKg).toBe(11.8);
  });

  it('flags a weighed loss beyond the tolerance', () => {
    const l = cylinderLedger(
      {
        kind: 'new',
        tareKg: 10,
        capacityKg: 20,
        weighings: [
          { at: '2026-03-01T00:00:00Z', grossKg: 30 },
          { at: '2026-04-01T00:00:00Z', grossKg: 27 },
        ],
        moves: [{ at: '2026-03-10T00:00:00Z', kg: 1.5, direction: 'out' }],
      },
      opts,
    );
    expect(l.reconciliation?.differenceKg).toBe(1.5);
    expect(l.reconciliation?.flagged).toBe(true);
  });

  it('fills a recovery cylinder, warns near the maximum and leaves the room before it', () => {
    const l = cylinderLedger(
      {
        kind: 'recovery',
        tareKg: 14,
        capacityKg: 10,
        weighings: [],
        moves: [{ at: '2026-03-10T00:00:00Z', kg: 9.2, direction: 'in' }],
      },
      opts,
    );
    expect(l.contentKg).toBe(9.2);
    expect(l.nearFull).toBe(true);
    expect(recoveryRoomKg(l, 10)).toBe(0.8);
  });

  it('does not know what a supply cylinder never weighed holds', () => {
    const l = cylinderLedger({ kind: 'new', tareKg: 12, capacityKg: 13.6, weighings: [], moves: [] }, opts);
    expect(l.contentKg).toBeNull();
    expect(l.reconciliation).toBeNull();
  });
});
