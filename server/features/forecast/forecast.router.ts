import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { startForecastCases } from '../jobs/jobs.service';

export function forecastRoutes(ctx: AppContext) {
  return [
    // Learns the forecast's case base again from the whole fleet, measures it, then recomputes every forecast.
    route('post', '/api/fleet/forecast/refresh', 'view:fleet', async (req, res) => {
      res
        .status(202)
        .json({ job: await startForecastCases(ctx, { userId: req.user!.id, message: 'Asked for on the overview.' }) });
    }),
  ];
}
