import type { AppContext } from '../../lib/app-context';
import { unitIdParam } from '../../lib/id-params';
import { route } from '../../lib/route';
import { recordPtiSchema, releaseUnitSchema } from '../../../shared/schemas/release';
import { recordPti, releaseUnit } from './release.service';

export function releaseRoutes(ctx: AppContext) {
  return [
    route('post', '/api/units/:id/pti', 'record:event', async (req, res) => {
      const { id } = unitIdParam.parse(req.params);
      const input = recordPtiSchema.parse(req.body);
      const { replayed, ...result } = await recordPti(ctx, req.user!, id, input);
      res.status(replayed ? 200 : 201).json(result);
    }),
    route('post', '/api/units/:id/release', 'record:event', async (req, res) => {
      const { id } = unitIdParam.parse(req.params);
      const input = releaseUnitSchema.parse(req.body);
      const { replayed, ...result } = await releaseUnit(ctx, req.user!, id, input);
      res.status(replayed ? 200 : 201).json(result);
    }),
  ];
}
