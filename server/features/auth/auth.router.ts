import { signInSchema } from '../../../shared/schemas/auth';
import type { AppContext } from '../../deps';
import { route } from '../../routes';
import { toUserDto } from '../users/users.mapper';
import { checkCredentials } from './auth.service';

export function authRoutes(ctx: AppContext) {
  return [
    route('post', '/api/auth/sign-in', 'public', async (req, res) => {
      const input = signInSchema.parse(req.body);
      const user = await checkCredentials(ctx.db, ctx.signInGuard, req, input);
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
