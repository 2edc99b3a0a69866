import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { jobIdParam } from '../../lib/id-params';
import { getJob } from './jobs.service';

export function jobsRoutes(ctx: AppContext) {
  return [
    route('get', '/api/jobs/:id', 'view:fleet', async (req, res) => {
      const { id } = jobIdParam.parse(req.params);
      res.json({ job: await getJob(ctx.db, id) });
    }),
  ];
}
