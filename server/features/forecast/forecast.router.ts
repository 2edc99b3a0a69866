import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';

export function forecastRoutes(ctx: AppContext) {
  return [
    // Learns the forecast's case base again from the whole fleet, measures it, then recomputes every forecast.
    route('post', '/api/fleet/forecast/refresh', 'view:fleet', async (req, res) => {
      res.status(202).json({
        job: await ctx.jobs.start('forecast_cases', { userId: req.user!.id, message: 'Asked for on the overview.' }),
      });
    }),
  ];
}
