import { createHash } from 'node:crypto';
import { signInSchema } from '../../../shared/schemas/account';
import { HttpError } from '../../lib/http-error';
import { clientAddress } from '../../lib/client-address';
import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { toUserDto } from '../../lib/user-dto';
import { checkCredentials } from './auth.service';

export function authRoutes(ctx: AppContext) {
  return [
    route('post', '/api/auth/sign-in', 'public', async (req, res) => {
      const input = signInSchema.parse(req.body);
      // Every sign-in decision is logged (ASVS 7.2.1): the account as a short hash, never the password.
      const account = createHash('sha256').update(input.email).digest('hex').slice(0, 16);
      const log = (outcome: string, user?: string) =>
        ctx.logger.info(
          { requestId: req.requestId, event: 'sign_in', outcome, account, user, ip: clientAddress(req) },
          'sign-in',
        );
      let user;
      try {
        user = await checkCredentials(ctx.db, ctx.signInGuard, req, input);
      } catch (err) {
        if (err instanceof HttpError) log(err.status === 429 ? 'throttled' : 'refused');
        throw err;
      }
      log('signed_in', user.id);
      await ctx.sessions.start(req, res, user);
      await ctx.signInGuard.remember(req, res, user.id);
      res.json({ user: toUserDto(user) });
    }),
    route('post', '/api/auth/sign-out', 'public', async (req, res) => {
      if (req.sessionId) await ctx.sessions.end(res, req.sessionId);
      else ctx.sessions.clearCookie(res);
      // Whatever this browser cached from the session (attachments of an older version were cacheable) goes too;
      // storage is left alone, so visits waiting in the queue survive.
      res.setHeader('Clear-Site-Data', '"cache"');
      res.status(204).end();
    }),
    route('get', '/api/auth/me', 'signed-in', async (req, res) => {
      res.json({ user: toUserDto(req.user!) });
    }),
  ];
}
