import { rateLimit } from 'express-rate-limit';
import type { Request, Response } from 'express';
import { idParamSchema } from '../../../shared/schemas/common';
import { linkTokenParamSchema, requestPasswordResetSchema, setPasswordSchema } from '../../../shared/schemas/account-links';
import type { AppContext } from '../../deps';
import { route } from '../../routes';
import { HttpError } from '../../lib/http-error';
import { toUserDto } from '../users/users.mapper';
import { completeLink, describeLink, requestPasswordReset, resendInvitation } from './account-links.service';

const WINDOW_MS = 15 * 60 * 1000;

function limited(_req: Request, _res: Response, next: (err: unknown) => void) {
  next(new HttpError(429, 'rate_limited', 'Too many password-reset requests. Wait 15 minutes and try again.'));
}

export function accountLinkRoutes(ctx: AppContext) {
  const perIp = rateLimit({ windowMs: WINDOW_MS, limit: ctx.rateLimits.resetPerIp, standardHeaders: 'draft-8', legacyHeaders: false, handler: limited });
  const perEmail = rateLimit({
    windowMs: WINDOW_MS,
    limit: ctx.rateLimits.resetPerEmail,
    standardHeaders: false,
    legacyHeaders: false,
    keyGenerator: (req) => {
      const email = (req.body as { email?: unknown } | undefined)?.email;
      return `reset:${typeof email === 'string' ? email.trim().toLowerCase() : ''}`;
    },
    handler: limited,
  });

  return [
    route('post', '/api/users/:id/invitation', 'manage:users', async (req, res) => {
      const { id } = idParamSchema.parse(req.params);
      await resendInvitation(ctx.db, ctx, id);
      res.status(202).json({ ok: true });
    }),
    route('get', '/api/invitations/:token', 'public', async (req, res) => {
      const { token } = linkTokenParamSchema.parse(req.params);
      res.json(await describeLink(ctx.db, ctx, 'invitation', token));
    }),
    route('post', '/api/invitations/:token', 'public', async (req, res) => {
      const { token } = linkTokenParamSchema.parse(req.params);
      const { password } = setPasswordSchema.parse(req.body);
      const user = await completeLink(ctx.db, ctx, 'invitation', token, password);
      await ctx.sessions.start(req, res, user.id);
      res.json({ user: toUserDto(user) });
    }),
    route(
      'post',
      '/api/password-reset',
      'public',
      async (req, res) => {
        const { email } = requestPasswordResetSchema.parse(req.body);
        await requestPasswordReset(ctx.db, ctx, email);
        res.status(202).json({ ok: true });
      },
      [perIp, perEmail],
    ),
    route('get', '/api/password-reset/:token', 'public', async (req, res) => {
      const { token } = linkTokenParamSchema.parse(req.params);
      res.json(await describeLink(ctx.db, ctx, 'password_reset', token));
    }),
    route('post', '/api/password-reset/:token', 'public', async (req, res) => {
      const { token } = linkTokenParamSchema.parse(req.params);
      const { password } = setPasswordSchema.parse(req.body);
      const user = await completeLink(ctx.db, ctx, 'password_reset', token, password);
      await ctx.sessions.start(req, res, user.id);
      res.json({ user: toUserDto(user) });
    }),
  ];
}
