import { sql } from 'drizzle-orm';
import type { AppContext } from '../../deps';
import { route } from '../../routes';

export function healthRoutes(ctx: AppContext) {
  return [
    route('get', '/api/health', 'public', async (_req, res) => {
      await ctx.db.execute(sql`SELECT 1`);
      res.json({ ok: true });
    }),
  ];
}
