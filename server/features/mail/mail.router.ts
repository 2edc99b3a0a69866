import { mailboxQuerySchema } from '../../../shared/schemas/mail';
import type { AppContext } from '../../lib/app-context';
import { route, type RouteSpec } from '../../lib/route';
import { listMailbox } from './mailbox.service';
import { notFound } from '../../lib/http-error';
import { clientAddress, isLoopback } from '../../lib/client-address';

/** The development mailbox: what the fake SMTP server received. */
export function mailRoutes(ctx: AppContext): RouteSpec[] {
  const routes: RouteSpec[] = [];
  // Mounted only while mail goes to the fake SMTP server (never in production, never with a real SMTP server), so
  // the path answers the ordinary API 404 otherwise. It holds every reset link: from another address than loopback
  // it is not there either, unless MAILBOX_FROM_ANY_ADDRESS asks for it.
  if (ctx.devTools) {
    routes.push(
      route('get', '/api/dev/mailbox', 'manage:settings', async (req, res) => {
        if (!ctx.mailboxFromAnyAddress && !isLoopback(clientAddress(req))) throw notFound('No such API route.');
        const { limit } = mailboxQuerySchema.parse(req.query);
        res.json(await listMailbox(ctx.db, limit));
      }),
    );
  }
  return routes;
}
