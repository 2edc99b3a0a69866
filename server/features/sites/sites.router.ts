import { createSiteSchema, siteIdParamSchema, updateSiteSchema } from '../../../shared/schemas/sites';
import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { createSite, deleteSite, getSite, listSites, recomputeSiteUnits, updateSite } from './sites.service';

export function sitesRoutes(ctx: AppContext) {
  return [
    route('get', '/api/sites', 'view:unit', async (_req, res) => {
      res.json({ sites: await listSites(ctx.db) });
    }),
    route('get', '/api/sites/:id', 'view:unit', async (req, res) => {
      const { id } = siteIdParamSchema.parse(req.params);
      res.json({ site: await getSite(ctx.db, id) });
    }),
    route('post', '/api/sites', 'manage:units', async (req, res) => {
      const input = createSiteSchema.parse(req.body);
      res.status(201).json({ site: await createSite(ctx.db, input) });
    }),
    route('patch', '/api/sites/:id', 'manage:units', async (req, res) => {
      const { id } = siteIdParamSchema.parse(req.params);
      const input = updateSiteSchema.parse(req.body);
      const { site, ruleChanged } = await updateSite(ctx.db, id, input);
      if (ruleChanged) await recomputeSiteUnits(ctx, id);
      res.json({ site });
    }),
    route('delete', '/api/sites/:id', 'manage:units', async (req, res) => {
      const { id } = siteIdParamSchema.parse(req.params);
      await deleteSite(ctx.db, id);
      res.status(204).end();
    }),
  ];
}
