// Unit histories for browser tests and screenshots: a unit row straight into the database, visits through the API
// (as the signed-in browser user, so they are recorded exactly as the app records them).
import { randomUUID } from 'node:crypto';
import type { APIRequestContext } from 'playwright-core';
import type { Db } from '../../server/db/client';
import { units } from '../../server/db/schema';
import { newToken } from '../../server/lib/ids';
import type { VisitEventInput } from '../../shared/schemas/history';
import { halyardNumber } from './units';

let serial = 0;

/**
 * A unit with a valid container number under its own owner code (HLQU, apart from the demo fleet's), serials from a
 * time-based base so repeated runs on one database do not clash.
 */
export async function createHistoryUnit(db: Db, overrides: Partial<typeof units.$inferInsert> = {}) {
  serial += 1;
  const row = {
    containerNumber: halyardNumber(100_000 + ((Math.floor(Date.now() / 1000) * 10 + serial) % 800_000), 'HLQ'),
    refrigerant: 'R-134a',
    nominalChargeKg: 4.5,
    commissionedOn: '2019-04-10',
    qrToken: newToken(),
    ...overrides,
  };
  const [{ id }] = await db.insert(units).values(row).$returningId();
  return { id, ...row };
}

export type VisitSpec = { at: string; events: VisitEventInput[] };

/** Records visits through POST /api/visits with the browser's session (same cookies, our Origin). */
export async function recordVisits(request: APIRequestContext, baseUrl: string, unitId: number, visits: VisitSpec[]) {
  for (const v of visits) {
    const res = await request.post(`${baseUrl}/api/visits`, {
      headers: { Origin: baseUrl },
      data: { idempotencyKey: randomUUID(), unitId, occurredAt: v.at, events: v.events },
    });
    if (res.status() !== 201) throw new Error(`visit ${v.at}: ${res.status()} ${await res.text()}`);
  }
}

const daysAgo = (now: Date, days: number, hour = 9) => {
  const d = new Date(now.getTime() - days * 86_400_000);
  d.setUTCHours(hour, 30, 0, 0);
  return d.toISOString();
};

const pressure = (
  suctionKPaG: number,
  dischargeKPaG: number,
  ambientC: number,
  sightGlass: 'full' | 'bubbles' = 'full',
) =>
  ({
    kind: 'pressure',
    suctionKPaG,
    dischargeKPaG,
    ambientC,
    setPointC: 2,
    supplyAirC: 1.6,
    returnAirC: 3.9,
    sightGlass,
    enteredAs: { pressureUnit: 'bar', temperatureUnit: 'C' },
  }) as const;

/**
 * Seven years of an R-134a unit that keeps leaking at a service valve, then at a brazed joint: top-ups, leak checks,
 * a valve-core repair, a rebraze with recovery and recharge, PTIs and pressure readings drifting as it loses charge.
 */
export function realisticHistory(now = new Date()): VisitSpec[] {
  return [
    { at: daysAgo(now, 1240), events: [{ kind: 'pti', passed: true }, pressure(95, 930, 24)] },
    {
      at: daysAgo(now, 1010),
      events: [
        { kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'service_valve' },
        { kind: 'top_up', kg: 0.6, cylinder: 'CYL-2231', enteredAs: { value: 0.6, unit: 'kg' } },
        pressure(70, 860, 22, 'bubbles'),
      ],
    },
    {
      at: daysAgo(now, 880),
      events: [
        { kind: 'leak_check', method: 'bubble_solution', leakFound: true, location: 'service_valve' },
        { kind: 'top_up', kg: 0.8, cylinder: 'CYL-2231' },
        {
          kind: 'repair',
          location: 'service_valve',
          action: 'valve_core_replaced',
          verified: true,
          note: 'Suction service valve core replaced; nitrogen test held 30 min.',
        },
        pressure(100, 945, 26),
      ],
    },
    { at: daysAgo(now, 700), events: [{ kind: 'pti', passed: true }, pressure(98, 935, 25)] },
    {
      at: daysAgo(now, 560),
      events: [
        { kind: 'leak_check', method: 'uv_dye', leakFound: true, location: 'brazed_joint' },
        { kind: 'top_up', kg: 0.7, cylinder: 'CYL-3310', enteredAs: { value: 1.54, unit: 'lb' } },
        pressure(80, 880, 27),
      ],
    },
    {
      at: daysAgo(now, 455),
      events: [{ kind: 'top_up', kg: 0.9, cylinder: 'CYL-3310' }, pressure(62, 840, 25, 'bubbles')],
    },
    {
      at: daysAgo(now, 320),
      events: [
        { kind: 'recovery', kg: 2.9, cylinder: 'REC-07' },
        {
          kind: 'repair',
          location: 'brazed_joint',
          action: 'rebrazed',
          verified: true,
          note: 'Discharge line joint at the condenser inlet rebrazed under nitrogen.',
        },
        { kind: 'recharge', kg: 4.5, cylinder: 'CYL-4102' },
        pressure(102, 950, 24),
      ],
    },
    { at: daysAgo(now, 300), events: [pressure(101, 948, 25)] },
    { at: daysAgo(now, 190), events: [{ kind: 'top_up', kg: 0.5, cylinder: 'CYL-4102' }, pressure(85, 900, 28)] },
    {
      at: daysAgo(now, 95),
      events: [{ kind: 'top_up', kg: 0.6, cylinder: 'CYL-4410' }, { kind: 'pti', passed: true }, pressure(82, 890, 23)],
    },
    {
      at: daysAgo(now, 20),
      events: [
        { kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'brazed_joint' },
        { kind: 'note', note: 'Oil stain back at the rebrazed joint. Parts ordered; unit released for one more trip.' },
        pressure(76, 870, 18),
      ],
    },
  ];
}
