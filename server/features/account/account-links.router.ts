import type { NextFunction, Request, Response } from 'express';
import { idParamSchema } from '../../../shared/schemas/common';
import { linkTokenParamSchema, requestPasswordResetSchema, setPasswordSchema } from '../../../shared/schemas/account';
import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { HttpError } from '../../lib/http-error';
import { addressBucket, clientAddress } from '../../lib/client-address';
import { toUserDto } from '../../lib/user-dto';
import { completeLink, describeLink, requestPasswordReset, resendInvitation } from './account-links.service';

const WINDOW_S = 15 * 60;

export function accountLinkRoutes(ctx: AppContext) {
  // Counted in MariaDB, like the sign-in limits: per address and per e-mail address asked about.
  const perAddress = ctx.counters('reset_addr', WINDOW_S);
  const perEmail = ctx.counters('reset_email', WINDOW_S);
  async function resetLimits(req: Request, _res: Response, next: NextFunction) {
    const email = (req.body as { email?: unknown } | undefined)?.email;
    const [a, e] = await Promise.all([
      perAddress.add(addressBucket(clientAddress(req))),
      perEmail.add(typeof email === 'string' ? email.trim().toLowerCase().slice(0, 254) : ''),
    ]);
    const over = [a.count > ctx.rateLimits.resetPerIp && a, e.count > ctx.rateLimits.resetPerEmail && e].filter(
      (x) => x !== false,
    );
    if (over.length) {
      const msLeft = Math.max(...over.map((x) => x.msLeft));
      return next(
        Object.assign(
          new HttpError(429, 'rate_limited', 'Too many password-reset requests. Wait 15 minutes and try again.'),
          {
            retryAfterSeconds: Math.max(1, Math.ceil(msLeft / 1000)),
          },
        ),
      );
    }
    next();
  }

  return [
    route('post', '/api/users/:id/invitation', 'manage:users', async (req, res) => {
      const { id } = idParamSchema.parse(req.params);
      await resendInvitation(ctx.db, ctx, id);
      res.status(202).json({ ok: true });
    }),
    route('get', '/api/invitations/:token', 'public', async (req, res) => {
      const { token } = linkTokenParamSchema.parse(req.params);
      res.json({ link: await describeLink(ctx.db, ctx, 'invitation', token) });
    }),
    route('post', '/api/invitations/:token', 'public', async (req, res) => {
      const { token } = linkTokenParamSchema.parse(req.params);
      const { password } = setPasswordSchema.parse(req.body);
      const user = await completeLink(ctx.db, ctx, 'invitation', token, password, {
        address: clientAddress(req),
        browser: req.get('user-agent') ?? null,
      });
      await ctx.sessions.start(req, res, user);
      await ctx.signInGuard.remember(req, res, user.id);
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
      [resetLimits],
    ),
    route('get', '/api/password-reset/:token', 'public', async (req, res) => {
      const { token } = linkTokenParamSchema.parse(req.params);
      res.json({ link: await describeLink(ctx.db, ctx, 'password_reset', token) });
    }),
    route('post', '/api/password-reset/:token', 'public', async (req, res) => {
      const { token } = linkTokenParamSchema.parse(req.params);
      const { password } = setPasswordSchema.parse(req.body);
      // A reset link signs in even while the account's ceiling of failed sign-ins is reached (decision record 007).
      const user = await completeLink(ctx.db, ctx, 'password_reset', token, password, {
        address: clientAddress(req),
        browser: req.get('user-agent') ?? null,
      });
      await ctx.sessions.start(req, res, user);
      await ctx.signInGuard.remember(req, res, user.id);
      res.json({ user: toUserDto(user) });
    }),
  ];
}
