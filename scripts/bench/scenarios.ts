// The scenarios: what each one requests, and the targets the issues set for them.
import type autocannon from 'autocannon';
import type { Rng } from '../../seed/simulator/prng';
import { FLEET_SORTS } from '../../shared/schemas/fleet';
import type { Dataset } from './dataset';
import { createWrites, type WriteContext } from './writes';

export type Regime = 'saturated' | 'steady';
export type Target = { p95Ms: number; at: Regime };
// Unit page (at 16 connections), visit write (the same) and the baseline share: the benchmark issue; the busy unit
// page and the visit write, p95 ≤ 50 ms with no load named: the service-history issue, read at the steady load; the
// fleet table and overview: the fleet-views issue, read saturated (the harder of the two).
export const TARGETS = {
  unitPage: [{ p95Ms: 30, at: 'saturated' }],
  unitPageBusy: [{ p95Ms: 50, at: 'steady' }],
  fleetTable: [{ p95Ms: 100, at: 'saturated' }],
  fleetOverview: [{ p95Ms: 300, at: 'saturated' }],
  visitWrite: [
    { p95Ms: 50, at: 'saturated' },
    { p95Ms: 50, at: 'steady' },
  ],
  unitPageBaselineShare: 0.4,
} satisfies Record<string, Target[] | number>;

export type Scenario = {
  id: string;
  title: string;
  targets?: Target[];
  /** A request that answers 404 while the scenario's route does not exist yet; empty for writes. */
  probe: string;
  requests: () => autocannon.Request[];
  /** Fewer connections than the others, said in the title. */
  connections?: number;
};

/** One GET a request, its path drawn anew each time. */
export const get = (p: () => string): autocannon.Request[] => [
  {
    method: 'GET',
    setupRequest: (req) => ({ ...req, path: p() }),
  },
];

export function buildScenarios(ds: Dataset, rng: Rng): Scenario[] {
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(rng.next() * xs.length)];
  const writes = createWrites(rng, ds.writeIds);
  const fleetQueries = [
    'sort=score&dir=desc',
    'sort=rate&dir=desc',
    'sort=forecast&dir=asc',
    `sort=score&dir=desc&siteId=${ds.siteId}`,
    'sort=score&dir=desc&band=chronic',
  ];
  const post = (body: () => { method: string; path: string; body: string }): autocannon.Request[] => [
    { method: 'POST', setupRequest: (req) => ({ ...req, ...body() }) },
  ];
  return [
    {
      id: 'unitPage',
      title: 'Unit page `GET /api/units/:id/overview`, random units',
      targets: TARGETS.unitPage,
      probe: `/api/units/${ds.unitIds[0]}/overview`,
      requests: () => get(() => `/api/units/${pick(ds.unitIds)}/overview`),
    },
    {
      id: 'unitPageBusy',
      title: `Unit page, the unit with ${ds.busy.events.toLocaleString('en')} events`,
      targets: TARGETS.unitPageBusy,
      probe: `/api/units/${ds.busy.unitId}/overview`,
      requests: () => get(() => `/api/units/${ds.busy.unitId}/overview`),
    },
    {
      id: 'fleetTable',
      title: 'Fleet table `GET /api/fleet` (3 sorts, site and band filters, pages 1–5)',
      targets: TARGETS.fleetTable,
      probe: `/api/fleet?${fleetQueries[0]}`,
      requests: () => get(() => `/api/fleet?${pick(fleetQueries)}&page=${1 + Math.floor(rng.next() * 5)}`),
    },
    {
      id: 'fleetOverview',
      title: 'Fleet overview `GET /api/fleet/overview`',
      targets: TARGETS.fleetOverview,
      probe: '/api/fleet/overview',
      requests: () => get(() => '/api/fleet/overview'),
    },
    {
      id: 'visitWrite',
      title: 'Visit write `POST /api/visits` (pressure reading + PTI, unique keys)',
      targets: TARGETS.visitWrite,
      probe: '',
      requests: () => post(writes.visit),
    },
    {
      id: 'visitTopUp',
      title: 'Visit with a top-up `POST /api/visits` (top-up + pressure reading, random units, unique keys)',
      probe: '',
      requests: () => post(writes.topUpVisit),
    },
    {
      id: 'mixedWrite',
      title:
        'Mixed writes: visits with a top-up (35 %), a recovery (10 %) or a pressure reading (15 %), voids of recent entries ' +
        '`POST /api/events/:id/void` (20 %), charge edits `PATCH /api/units/:id` (20 %)',
      probe: '',
      requests: () => [
        {
          method: 'POST',
          setupRequest: (req, context) => ({ ...req, ...writes.mixedWrite(context as WriteContext) }),
          onResponse: (status, body, context) => writes.answered(status, body, context as WriteContext),
        },
      ],
    },
    {
      id: 'scanLookup',
      title: 'Scan lookup `GET /api/units/by-token/:token`',
      probe: `/api/units/by-token/${ds.tokens[0]}`,
      requests: () => get(() => `/api/units/by-token/${pick(ds.tokens)}`),
    },
  ];
}

/** Every sort both ways and every filter on its own, each measured by itself (the fleet-views issue asks for each). */
export function fleetEachQueries(ds: Dataset): string[] {
  return [
    ...FLEET_SORTS.flatMap((s) => [`sort=${s}&dir=desc`, `sort=${s}&dir=asc`]),
    ...[
      `siteId=${ds.siteId}`,
      'refrigerant=R-404A',
      'status=out_of_service',
      'band=chronic',
      'band=watch',
      'rateAbove=20',
      'forecastDays=30',
      'forecastOverdue=1',
      'leakCheckOverdue=1',
      'ptiExpired=1',
      // The overview's bars and My day's groups.
      'rateFrom=10&rateBelow=20',
      'rateAtMost=0',
      'leakCheckDueDays=30',
      'quarantined=1',
      'recheckDue=1',
      'openLeak=1',
      'ptiExpiredDays=7',
      'ptiExpiringDays=14',
      'forecastRangeDays=7',
      `q=${ds.sampleNumber.slice(0, 6)}`,
      `q=${ds.sampleNumber.slice(0, 7)}`,
      `q=${ds.sampleNumber.slice(0, 8)}`,
      ...(ds.onePercentPrefix ? [`q=${ds.onePercentPrefix}`] : []),
      'page=40',
      'count=1',
      `count=1&siteId=${ds.siteId}`,
      'count=1&band=watch',
    ].map((f) => `sort=score&dir=desc&${f}`),
  ];
}
