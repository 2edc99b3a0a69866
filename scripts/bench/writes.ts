// The bodies of the write scenarios: visits with a pressure reading and PTI or a top-up, and the mixed scenario, where
// what each connection sends next is drawn by weight and voids take entries this process recorded moments ago (each at
// most once, so a 409 for an entry voided twice does not count as a failure of the write path).
import type { Rng } from '../../seed/simulator/prng';
import { noteAnsweredKind, type RequestContext } from './measure';

export type WriteKind = 'topUp' | 'recovery' | 'pressure' | 'void' | 'unitEdit';
export type WriteContext = RequestContext & { kind?: WriteKind };
const MIX: [WriteKind, number][] = [
  ['topUp', 0.35],
  ['recovery', 0.1],
  ['pressure', 0.15],
  ['void', 0.2],
  ['unitEdit', 0.2],
];
/** The kinds in the order the results list them. */
export const WRITE_KIND_ORDER: string[] = MIX.map(([kind]) => kind);
export const WRITE_NAMES = {
  visitWrite: 'Visit (pressure reading + PTI)',
  visitTopUp: 'Visit with a top-up',
  mixedWrite: 'Mixed writes',
};
export const KIND_NAMES: Record<WriteKind, string> = {
  topUp: 'visit with a top-up',
  recovery: 'visit with a recovery',
  pressure: 'visit with a pressure reading',
  void: 'void of a recent entry',
  unitEdit: 'charge edit',
};
const RECENT_EVENTS_KEPT = 5000;
const pressureEntry = {
  kind: 'pressure',
  suctionKPaG: 95,
  dischargeKPaG: 880,
  ambientC: 21.5,
  setPointC: -18,
  sightGlass: 'full',
};

type WriteRequest = { method: string; path: string; body: string };

export function createWrites(rng: Rng, writeIds: number[]) {
  const runTag = Date.now().toString(36);
  let seq = 0;
  const recentEvents: number[] = [];
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(rng.next() * xs.length)];
  const visitBody = (events: object[] = [pressureEntry, { kind: 'pti', passed: true }]) => {
    seq++;
    return {
      idempotencyKey: `bench-${runTag}-${seq}`,
      unitId: pick(writeIds),
      occurredAt: new Date(Date.now() - 60_000).toISOString(),
      events,
    };
  };
  // Up to 1.5 kg, well under twice the smallest charge a unit is seeded with, so every body passes the plausibility rule.
  const someKg = () => Math.round(20 + rng.next() * 130) / 100;
  const cylinderId = () => `BENCH-CYL-${100 + Math.floor(rng.next() * 24)}`;
  const topUpEntries = () => [{ kind: 'top_up', kg: someKg(), cylinder: cylinderId() }, pressureEntry];
  const visit = (events?: object[]): WriteRequest => ({
    method: 'POST',
    path: '/api/visits',
    body: JSON.stringify(visitBody(events)),
  });

  function mixedWrite(context: WriteContext): WriteRequest {
    let r = rng.next();
    let kind = MIX.find(([, w]) => (r -= w) < 0)?.[0] ?? 'topUp';
    if (kind === 'void' && !recentEvents.length) kind = 'topUp';
    context.kind = kind;
    switch (kind) {
      case 'void': {
        const i = Math.floor(rng.next() * recentEvents.length);
        const id = recentEvents[i];
        recentEvents[i] = recentEvents[recentEvents.length - 1];
        recentEvents.pop();
        return {
          method: 'POST',
          path: `/api/events/${id}/void`,
          body: JSON.stringify({ reason: 'Benchmark: entered on the wrong unit' }),
        };
      }
      case 'unitEdit':
        return {
          method: 'PATCH',
          path: `/api/units/${pick(writeIds)}`,
          body: JSON.stringify({ nominalChargeKg: Math.round(40 + rng.next() * 20) / 10 }),
        };
      case 'recovery':
        return visit([{ kind: 'recovery', kg: someKg(), cylinder: cylinderId() }]);
      case 'pressure':
        return visit([pressureEntry]);
      default:
        return visit(topUpEntries());
    }
  }

  function answered(status: number, body: string, context: WriteContext) {
    noteAnsweredKind(context.kind);
    if (status !== 201 || context.kind === 'void' || context.kind === 'unitEdit') return;
    for (const e of (JSON.parse(body) as { events: { id: number }[] }).events) recentEvents.push(e.id);
    if (recentEvents.length > RECENT_EVENTS_KEPT) recentEvents.splice(0, recentEvents.length - RECENT_EVENTS_KEPT);
  }

  return {
    /** A visit with a pressure reading and a PTI. */
    visit: () => visit(),
    /** A visit with a top-up and a pressure reading. */
    topUpVisit: () => visit(topUpEntries()),
    mixedWrite,
    answered,
  };
}
