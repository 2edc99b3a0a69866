import { mailboxQuerySchema } from '../../../shared/schemas/mail';
import type { AppContext } from '../../deps';
import { route, type RouteSpec } from '../../routes';
import { accountLinkRoutes } from '../account-links/account-links.router';
import { alertRoutes } from '../alerts/alerts.router';
import { listMailbox } from './mailbox.service';

/** Everything that goes out by e-mail: invitation and reset links, alert subscriptions, the development mailbox. */
export function mailRoutes(ctx: AppContext): RouteSpec[] {
  const routes = [...accountLinkRoutes(ctx), ...alertRoutes(ctx)];
  // Not mounted in production, so the path answers the ordinary API 404 there.
  if (ctx.devTools) {
    routes.push(
      route('get', '/api/dev/mailbox', 'manage:settings', async (req, res) => {
        const { limit } = mailboxQuerySchema.parse(req.query);
        res.json(await listMailbox(ctx.db, limit));
      }),
    );
  }
  return routes;
}
