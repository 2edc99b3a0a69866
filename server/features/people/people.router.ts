// The administrator's list of people: adding, changing roles, deactivating, and ending their sessions.
import { eq } from 'drizzle-orm';
import { sessionParamSchema } from '../../../shared/schemas/account';
import { createUserSchema, updateUserSchema } from '../../../shared/schemas/people';
import { idParamSchema } from '../../../shared/schemas/common';
import { users } from '../../db/schema';
import type { AppContext } from '../../lib/app-context';
import { notFound } from '../../lib/http-error';
import { route } from '../../lib/route';
import { createUser, listUsers, updateUser } from './people.service';

export function peopleRoutes(ctx: AppContext) {
  async function userOr404(id: string) {
    const [u] = await ctx.db.select({ id: users.id, role: users.role }).from(users).where(eq(users.id, id));
    if (!u) throw notFound('No such user.');
    return u;
  }

  return [
    route('get', '/api/users', 'manage:users', async (_req, res) => {
      res.json({ users: await listUsers(ctx.db) });
    }),
    route('post', '/api/users', 'manage:users', async (req, res) => {
      const input = createUserSchema.parse(req.body);
      res.status(201).json({ user: await createUser(ctx.db, input, ctx) });
    }),
    route('patch', '/api/users/:id', 'manage:users', async (req, res) => {
      const { id } = idParamSchema.parse(req.params);
      const input = updateUserSchema.parse(req.body);
      res.json({ user: await updateUser(ctx.db, req.user!.id, id, input) });
    }),
    route('get', '/api/users/:id/sessions', 'manage:users', async (req, res) => {
      const { id } = idParamSchema.parse(req.params);
      res.json({ sessions: await ctx.sessions.list(await userOr404(id), req.sessionId) });
    }),
    route('delete', '/api/users/:id/sessions', 'manage:users', async (req, res) => {
      const { id } = idParamSchema.parse(req.params);
      await userOr404(id);
      await ctx.sessions.endAllFor(id);
      res.status(204).end();
    }),
    route('delete', '/api/users/:id/sessions/:sessionId', 'manage:users', async (req, res) => {
      const { id, sessionId } = sessionParamSchema.parse(req.params);
      await userOr404(id);
      if (!(await ctx.sessions.endOne(id, sessionId))) throw notFound('That session has already ended.');
      res.status(204).end();
    }),
  ];
}
