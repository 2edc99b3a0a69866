import { createUserSchema, updateUserSchema } from '../../../shared/schemas/users';
import { idParamSchema } from '../../../shared/schemas/common';
import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { createUser, listUsers, updateUser } from './people.service';

export function peopleRoutes(ctx: AppContext) {
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
  ];
}
