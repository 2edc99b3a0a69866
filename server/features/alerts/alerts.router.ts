import { putSubscriptionsSchema, unsubscribeSchema } from '../../../shared/schemas/alerts';
import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { getSubscriptions, putSubscriptions, unsubscribe } from './alerts.service';

export function alertRoutes(ctx: AppContext) {
  return [
    route('get', '/api/alerts/subscriptions', 'view:fleet', async (req, res) => {
      res.json(await getSubscriptions(ctx.db, req.user!, ctx.clock.now()));
    }),
    route('put', '/api/alerts/subscriptions', 'view:fleet', async (req, res) => {
      const input = putSubscriptionsSchema.parse(req.body);
      res.json(await putSubscriptions(ctx.db, req.user!, input, ctx.clock.now()));
    }),
    // From the signed link in a mail: no session needed, the signature proves whose subscription it is.
    route('post', '/api/alerts/unsubscribe', 'public', async (req, res) => {
      const input = unsubscribeSchema.parse(req.body);
      res.json(await unsubscribe(ctx.db, input, ctx.clock.now()));
    }),
  ];
}
