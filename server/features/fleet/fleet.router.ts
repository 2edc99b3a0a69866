import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { fleetFiltersSchema, fleetOverviewQuerySchema, fleetQuerySchema } from '../../../shared/schemas/fleet';
import { sendCsv, streamRows } from '../../lib/csv-stream';
import { todayOf } from '../../lib/dates';
import { countFleet, fleetSelect, listFleet, ROW_FIELD_NAMES, shouldForceSortIndex, toFleetRow } from './fleet.service';
import { createOverviewCache, fleetOverview } from './overview.service';

const FLEET_CSV_COLUMNS = [
  'Container number',
  'Site',
  'Refrigerant',
  'Full charge (kg)',
  'Status',
  'Repeat-leak score',
  'Band',
  'Rolling leak rate (%)',
  'Charge (t CO2e)',
  'Next top-up forecast',
  'Forecast overdue',
  'Next leak check due',
  'Leak check overdue',
  'PTI valid until',
  'PTI valid',
  'Pressure health',
  'Last event',
  'Figures',
];

export function fleetRoutes(ctx: AppContext) {
  const overviewCache = createOverviewCache();
  return [
    route('get', '/api/fleet', 'view:fleet', async (req, res) => {
      const q = fleetQuerySchema.parse(req.query);
      res.json(await listFleet(ctx.db, ctx.caches, q, ctx.clock.now()));
    }),
    route('get', '/api/fleet/count', 'view:fleet', async (req, res) => {
      const f = fleetFiltersSchema.parse(req.query);
      res.json(await countFleet(ctx.db, ctx.caches, f, todayOf(ctx.clock.now())));
    }),
    route('get', '/api/fleet/export.csv', 'view:fleet', async (req, res) => {
      const q = fleetQuerySchema.parse(req.query);
      const today = todayOf(ctx.clock.now());
      const nullable = ['forecast', 'leakCheck', 'pti'].includes(q.sort) && q.dir === 'asc';
      const force = await shouldForceSortIndex(ctx.db, ctx.caches, q);
      const parts = nullable
        ? [fleetSelect(ctx.db, q, today, 'none', force), fleetSelect(ctx.db, q, today, 'only')]
        : [fleetSelect(ctx.db, q, today, undefined, force)];
      async function* records() {
        for (const part of parts) {
          for await (const raw of streamRows(ctx.db, part)) {
            const r = toFleetRow(
              Object.fromEntries(ROW_FIELD_NAMES.map((k, i) => [k, raw[i]])) as Parameters<typeof toFleetRow>[0],
              today,
            );
            yield [
              r.containerNumber,
              r.site?.name ?? '',
              r.refrigerant,
              r.nominalChargeKg,
              r.status,
              r.score,
              r.scoreBand,
              r.rollingLeakRatePct,
              r.co2eTonnes,
              r.forecastDate ?? '',
              r.forecastDate ? r.forecastOverdue : '',
              r.nextLeakCheckDue ?? '',
              r.nextLeakCheckDue ? r.leakCheckOverdue : '',
              r.ptiValidUntil ?? '',
              r.ptiValid,
              r.pressureFlag,
              r.lastEventAt ?? '',
              r.computeError ? `cannot compute: ${r.computeError}` : 'computed',
            ];
          }
        }
      }
      await sendCsv(res, `fleet-${today}.csv`, FLEET_CSV_COLUMNS, records());
    }),
    route('get', '/api/fleet/overview', 'view:fleet', async (req, res) => {
      const q = fleetOverviewQuerySchema.parse(req.query);
      res.json(await fleetOverview(ctx.db, ctx.caches, q, ctx.clock.now(), overviewCache));
    }),
    route('post', '/api/fleet/repair-effectiveness/refresh', 'view:fleet', async (req, res) => {
      res.status(202).json({ job: await ctx.jobs.start('repair_effectiveness', { userId: req.user!.id }) });
    }),
  ];
}
