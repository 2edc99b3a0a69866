import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { fleetFiltersSchema, fleetOverviewQuerySchema, fleetQuerySchema } from '../../../shared/schemas/fleet';
import { sendCsv } from '../../lib/csv-stream';
import { FLEET_CSV_COLUMNS, fleetCsvRecords } from './fleet-csv';
import { todayOf } from '../../lib/dates';
import { countFleet, listFleet, shouldForceSortIndex } from './fleet.service';
import { createOverviewCache, fleetOverview } from './overview.service';

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
      const force = await shouldForceSortIndex(ctx.db, ctx.caches, q);
      await sendCsv(res, `fleet-${today}.csv`, FLEET_CSV_COLUMNS, fleetCsvRecords(ctx.db, q, today, force));
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
