import { rateLimit } from 'express-rate-limit';
import type { Request, Response } from 'express';
import { signInSchema } from '../../../shared/schemas/auth';
import type { AppContext } from '../../deps';
import { route } from '../../routes';
import { HttpError } from '../../lib/http-error';
import { toUserDto } from '../users/users.mapper';
import { checkCredentials } from './auth.service';

const WINDOW_MS = 15 * 60 * 1000;

function limited(_req: Request, _res: Response, next: (err: unknown) => void) {
  next(new HttpError(429, 'rate_limited', 'Too many sign-in attempts. Wait 15 minutes and try again.'));
}

export function authRoutes(ctx: AppContext) {
  const perIp = rateLimit({ windowMs: WINDOW_MS, limit: ctx.rateLimits.signInPerIp, standardHeaders: 'draft-8', legacyHeaders: false, handler: limited });
  const perAccount = rateLimit({
    windowMs: WINDOW_MS,
    limit: ctx.rateLimits.signInPerAccount,
    standardHeaders: false,
    legacyHeaders: false,
    // Only failures count against an account, so a person who signs in often is never locked out.
    skipSuccessfulRequests: true,
    keyGenerator: (req) => {
      const email = (req.body as { email?: unknown } | undefined)?.email;
      return `acct:${typeof email === 'string' ? email.trim().toLowerCase() : ''}`;
    },
    handler: limited,
  });

  return [
    route(
      'post',
      '/api/auth/sign-in',
      'public',
      async (req, res) => {
        const input = signInSchema.parse(req.body);
        const user = await checkCredentials(ctx.db, input);
        await ctx.sessions.start(req, res, user.id);
        res.json({ user: toUserDto(user) });
      },
      [perIp, perAccount],
    ),
    route('post', '/api/auth/sign-out', 'public', async (req, res) => {
      if (req.sessionId) await ctx.sessions.end(req, res, req.sessionId);
      else ctx.sessions.clearCookie(req, res);
      res.status(204).end();
    }),
    route('get', '/api/auth/me', 'signed-in', async (req, res) => {
      res.json({ user: toUserDto(req.user!) });
    }),
  ];
}
