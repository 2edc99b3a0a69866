import type { AppContext } from '../../lib/app-context';
import { unitIdParam } from '../../lib/id-params';
import { route } from '../../lib/route';
import { dayQuerySchema } from '../../../shared/schemas/day';
import { myDay, unitDepot } from './day.service';

export function dayRoutes(ctx: AppContext) {
  return [
    route('get', '/api/day', 'view:unit', async (req, res) => {
      const { siteId } = dayQuerySchema.parse(req.query);
      res.json(await myDay(ctx.db, req.user!, siteId, ctx.clock.now(), await ctx.caches.settings.get(ctx.db)));
    }),
    route('get', '/api/units/:id/depot', 'view:unit', async (req, res) => {
      const { id } = unitIdParam.parse(req.params);
      res.json(await unitDepot(ctx.db, id, ctx.clock.now(), await ctx.caches.settings.get(ctx.db)));
    }),
  ];
}
