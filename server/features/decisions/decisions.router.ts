import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { candidatesQuerySchema, recordDecisionSchema } from '../../../shared/schemas/decisions';
import { unitIdParam } from '../../lib/id-params';
import { getUnitDecision, recordDecision, retirementCandidates } from './decisions.service';

export function decisionsRoutes(ctx: AppContext) {
  return [
    route('get', '/api/decisions/candidates', 'decide:retirement', async (req, res) => {
      const q = candidatesQuerySchema.parse(req.query);
      res.json(await retirementCandidates(ctx.db, ctx.caches.settings, q, ctx.clock.now()));
    }),
    route('get', '/api/decisions/units/:id', 'decide:retirement', async (req, res) => {
      const { id } = unitIdParam.parse(req.params);
      res.json(await getUnitDecision(ctx.db, ctx.caches.settings, id, ctx.clock.now()));
    }),
    route('post', '/api/decisions/units/:id', 'decide:retirement', async (req, res) => {
      const { id } = unitIdParam.parse(req.params);
      const input = recordDecisionSchema.parse(req.body);
      const result = await recordDecision(ctx, req.user!, id, input);
      res.status(result.replayed ? 200 : 201).json(result);
    }),
  ];
}
