// "Signed-in devices" and the password, for the person themselves (an administrator ends anyone's sessions from the
// people feature).
import { changePasswordSchema, endMySessionsSchema, passwordCheckSchema } from '../../../shared/schemas/account';
import type { AppContext } from '../../lib/app-context';
import { badRequest, HttpError, notFound } from '../../lib/http-error';
import { addressBucket, clientAddress } from '../../lib/client-address';
import { assessPassword } from '../../lib/password-policy';
import { route } from '../../lib/route';
import { changePassword, confirmPassword } from './account.service';

export function accountRoutes(ctx: AppContext) {
  // The meter asks as the person types; a generous limit per address keeps it from being a free CPU for anyone.
  const checks = ctx.counters('pwcheck_addr', 15 * 60);
  const PASSWORD_CHECKS_PER_ADDRESS = 600;

  return [
    route('post', '/api/password-check', 'public', async (req, res) => {
      const counted = await checks.add(addressBucket(clientAddress(req)));
      if (counted.count > PASSWORD_CHECKS_PER_ADDRESS) {
        throw Object.assign(new HttpError(429, 'rate_limited', 'Too many password checks. Wait a few minutes.'), {
          retryAfterSeconds: Math.max(1, Math.ceil(counted.msLeft / 1000)),
        });
      }
      const input = passwordCheckSchema.parse(req.body);
      // Signed in (the account page): the person is the session's user, whatever the body says.
      const person = req.user ?? { email: input.email ?? '', name: input.name ?? null };
      const { score, problem } = assessPassword(input.password, person);
      res.json({ score, acceptable: problem === null, problem });
    }),
    route('get', '/api/account/sessions', 'signed-in', async (req, res) => {
      res.json({ sessions: await ctx.sessions.list(req.user!, req.sessionId) });
    }),
    // Asks for the password again, so a stolen session cannot sign the owner out of their other devices.
    route('post', '/api/account/sessions/sign-out', 'signed-in', async (req, res) => {
      const input = endMySessionsSchema.parse(req.body);
      if (input.sessionId === req.sessionId) {
        throw badRequest('Use "Sign out" to end this session.', { sessionId: 'This is the session you are using.' });
      }
      await confirmPassword(ctx, req, req.user!, input.password, 'password');
      if (input.sessionId) {
        if (!(await ctx.sessions.endOne(req.user!.id, input.sessionId)))
          throw notFound('That session has already ended.');
        res.json({ ended: 1 });
      } else {
        res.json({ ended: await ctx.sessions.endOthers(req.user!.id, req.sessionId!) });
      }
    }),
    route('post', '/api/account/password', 'signed-in', async (req, res) => {
      const input = changePasswordSchema.parse(req.body);
      res.json(await changePassword(ctx, req, req.user!, input.currentPassword, input.newPassword));
    }),
  ];
}
