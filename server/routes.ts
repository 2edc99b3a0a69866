// Where every API route is mounted: each feature's route table, in one list. A feature's routes come only from its
// own router; no router mounts another feature's routes.
import { sql } from 'drizzle-orm';
import type { AppContext } from './lib/app-context';
import { route, type RouteSpec } from './lib/route';
import { accountLinkRoutes } from './features/account/account-links.router';
import { accountRoutes } from './features/account/account.router';
import { authRoutes } from './features/account/auth.router';
import { alertRoutes } from './features/alerts/alerts.router';
import { cylindersRoutes } from './features/cylinders/cylinders.router';
import { dayRoutes } from './features/day/day.router';
import { decisionsRoutes } from './features/decisions/decisions.router';
import { fleetRoutes } from './features/fleet/fleet.router';
import { forecastRoutes } from './features/forecast/forecast.router';
import { handoverRoutes } from './features/handover/handover.router';
import { historyRoutes } from './features/history/history.router';
import { importsRoutes } from './features/imports/imports.router';
import { jobsRoutes } from './features/jobs/jobs.router';
import { labelsRoutes } from './features/labels/labels.router';
import { mailRoutes } from './features/mail/mail.router';
import { peopleRoutes } from './features/people/people.router';
import { quarantineRoutes } from './features/quarantine/quarantine.router';
import { refrigerantLogRoutes } from './features/refrigerant-log/refrigerant-log.router';
import { releaseRoutes } from './features/release/release.router';
import { settingsRoutes } from './features/settings/settings.router';
import { sitesRoutes } from './features/sites/sites.router';
import { traceRoutes } from './features/trace/trace.router';
import { unitsRoutes } from './features/units/units.router';

/** The process answers and its database does (load balancers, `npm start`'s readiness wait). */
function healthRoutes(ctx: AppContext): RouteSpec[] {
  return [
    route('get', '/api/health', 'public', async (_req, res) => {
      await ctx.db.execute(sql`SELECT 1`);
      res.json({ ok: true });
    }),
  ];
}

export function allRoutes(ctx: AppContext): RouteSpec[] {
  return [
    ...healthRoutes(ctx),
    ...authRoutes(ctx),
    ...accountRoutes(ctx),
    ...peopleRoutes(ctx),
    ...historyRoutes(ctx),
    ...accountLinkRoutes(ctx),
    ...alertRoutes(ctx),
    ...mailRoutes(ctx),
    ...unitsRoutes(ctx),
    ...sitesRoutes(ctx),
    ...labelsRoutes(ctx),
    ...importsRoutes(ctx),
    ...fleetRoutes(ctx),
    ...forecastRoutes(ctx),
    ...traceRoutes(ctx),
    ...cylindersRoutes(ctx),
    ...handoverRoutes(ctx),
    ...refrigerantLogRoutes(ctx),
    ...decisionsRoutes(ctx),
    ...settingsRoutes(ctx),
    ...jobsRoutes(ctx),
    ...dayRoutes(ctx),
    ...quarantineRoutes(ctx),
    ...releaseRoutes(ctx),
  ];
}
