import { describe, expect, it } from 'vitest';
import { rechecksFromHistory, type DepotEvent } from '../../../shared/domain/rechecks';
import { convertPressure } from '../../../shared/domain';
import { settingsSchema } from '../../../shared/schemas/settings';
import { day } from './helpers';

const psi = (v: number) => convertPressure(v, { unit: 'psi', ref: 'gauge' }, { unit: 'kPa', ref: 'gauge' });
const unit = { refrigerant: 'R-134a', commissionedOn: day(-400) };
let nextId = 1;
const ev = (e: Omit<DepotEvent, 'id'>): DepotEvent => ({ id: nextId++, ...e });

describe('re-checks', () => {
  it('asks for a re-check the day after a top-up where no leak was found and repaired', () => {
    // Common practice, no published source: a technician comes back the next day to see that the charge held.
    const r = rechecksFromHistory(unit, [ev({ kind: 'top_up', at: `${day(-1)}T09:00:00Z`, visitId: 'a' })], day(0));
    expect(r.rechecks).toHaveLength(1);
    expect(r.rechecks[0]).toMatchObject({ reason: 'top_up', dueOn: day(0), status: 'due' });
    expect(r.open?.dueOn).toBe(day(0));
  });

  it('asks for none after a top-up in a visit where the leak was found and repaired', () => {
    const r = rechecksFromHistory(
      unit,
      [
        ev({ kind: 'leak_check', at: `${day(-3)}T09:00:00Z`, visitId: 'a', leakFound: true }),
        ev({ kind: 'repair', at: `${day(-3)}T09:30:00Z`, visitId: 'a' }),
        ev({ kind: 'top_up', at: `${day(-3)}T10:00:00Z`, visitId: 'a' }),
      ],
      day(0),
    );
    // Only the repair's own re-check remains.
    expect(r.rechecks.map((c) => c.reason)).toEqual(['repair']);
  });

  it('asks for a re-check within a month of every repair', () => {
    // Source: Regulation (EU) 2024/573 — a leak check within one month after a repair.
    const r = rechecksFromHistory(unit, [ev({ kind: 'repair', at: `${day(-10)}T12:00:00Z`, visitId: 'a' })], day(0));
    expect(r.rechecks[0]).toMatchObject({ reason: 'repair', dueOn: day(20), status: 'open' });
  });

  it('takes the intervals from the settings', () => {
    const settings = settingsSchema.parse({ rechecks: { afterTopUpDays: 2, afterRepairDays: 14 } });
    const r = rechecksFromHistory(
      unit,
      [
        ev({ kind: 'top_up', at: `${day(-1)}T09:00:00Z`, visitId: 'a' }),
        ev({ kind: 'repair', at: `${day(-1)}T10:00:00Z`, visitId: 'a' }),
      ],
      day(0),
      settings,
    );
    expect(r.rechecks.map((c) => c.dueOn)).toEqual([day(1), day(13)]);
  });

  it('is cleared by a leak check in a later visit that found nothing: the charge held', () => {
    const r = rechecksFromHistory(
      unit,
      [
        ev({ kind: 'top_up', at: `${day(-2)}T09:00:00Z`, visitId: 'a' }),
        ev({ kind: 'leak_check', at: `${day(-1)}T08:00:00Z`, visitId: 'b', leakFound: false }),
      ],
      day(0),
    );
    expect(r.rechecks[0]).toMatchObject({ status: 'done', outcome: 'held', doneOn: day(-1) });
    expect(r.open).toBeNull();
  });

  it('is not cleared by a reading taken in the same visit as the top-up', () => {
    const r = rechecksFromHistory(
      unit,
      [
        ev({ kind: 'top_up', at: `${day(-1)}T09:00:00Z`, visitId: 'a' }),
        ev({ kind: 'pressure', at: `${day(-1)}T09:10:00Z`, visitId: 'a', dischargeKPaG: psi(140), ambientC: 30 }),
      ],
      day(0),
    );
    expect(r.rechecks[0].status).toBe('due');
  });

  it('says the charge did not hold when the next reading drifts 3 K below the post-charge baseline', () => {
    // DOMAIN.md §8 (common practice): drift ≤ −3 K against the baseline after the recharge is "possible low charge".
    // 140 psig → 41.81 °C, 125 psig → 38.01 °C dew (R-134a): approach 11.81 K then 8.01 K at 30 °C ambient.
    const r = rechecksFromHistory(
      unit,
      [
        ev({ kind: 'recharge', at: `${day(-60)}T09:00:00Z`, visitId: 'r' }),
        ev({ kind: 'pressure', at: `${day(-60)}T10:00:00Z`, visitId: 'r', dischargeKPaG: psi(140), ambientC: 30 }),
        ev({ kind: 'top_up', at: `${day(-2)}T09:00:00Z`, visitId: 'a' }),
        ev({ kind: 'pressure', at: `${day(-1)}T09:00:00Z`, visitId: 'b', dischargeKPaG: psi(125), ambientC: 30 }),
      ],
      day(0),
    );
    const c = r.rechecks.find((x) => x.reason === 'top_up')!;
    expect(c).toMatchObject({ status: 'done', outcome: 'not_held' });
    expect(c.outcomeWords).toContain('below');
  });

  it('says the charge held when the next reading is within the drift limit of the baseline', () => {
    const r = rechecksFromHistory(
      unit,
      [
        ev({ kind: 'recharge', at: `${day(-60)}T09:00:00Z`, visitId: 'r' }),
        ev({ kind: 'pressure', at: `${day(-60)}T10:00:00Z`, visitId: 'r', dischargeKPaG: psi(140), ambientC: 30 }),
        ev({ kind: 'top_up', at: `${day(-2)}T09:00:00Z`, visitId: 'a' }),
        ev({ kind: 'pressure', at: `${day(-1)}T09:00:00Z`, visitId: 'b', dischargeKPaG: psi(139), ambientC: 30 }),
      ],
      day(0),
    );
    expect(r.rechecks.find((x) => x.reason === 'top_up')).toMatchObject({ status: 'done', outcome: 'held' });
  });

  it('counts a re-check done after its day, or still open after it, as missed', () => {
    const r = rechecksFromHistory(
      unit,
      [
        ev({ kind: 'top_up', at: `${day(-100)}T09:00:00Z`, visitId: 'a' }),
        ev({ kind: 'leak_check', at: `${day(-90)}T09:00:00Z`, visitId: 'b', leakFound: false }),
        ev({ kind: 'top_up', at: `${day(-20)}T09:00:00Z`, visitId: 'c' }),
      ],
      day(0),
    );
    expect(r.rechecks.map((c) => c.missed)).toEqual([true, true]);
    expect(r.missed365).toBe(2);
    expect(r.rechecks[1].status).toBe('overdue');
  });

  it('ignores fills that are not made-up refrigerant', () => {
    const r = rechecksFromHistory(
      unit,
      [ev({ kind: 'top_up', at: `${day(-1)}T09:00:00Z`, visitId: 'a', excluded: true })],
      day(0),
    );
    expect(r.rechecks).toEqual([]);
  });
});
