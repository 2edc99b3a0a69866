import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { refrigerantLogQuerySchema } from '../../../shared/schemas/refrigerant-log';
import { sendCsv } from '../../lib/csv-stream';
import { LOG_CSV_COLUMNS, refrigerantLogCsvNote, refrigerantLogCsvRecords } from './refrigerant-log-csv';
import { logTotals, refrigerantLog } from './refrigerant-log.service';

export function refrigerantLogRoutes(ctx: AppContext) {
  return [
    route('get', '/api/refrigerant-log', 'view:fleet', async (req, res) => {
      const q = refrigerantLogQuerySchema.parse(req.query);
      res.json(await refrigerantLog(ctx.db, q, await ctx.caches.settings.get(ctx.db)));
    }),
    route('get', '/api/refrigerant-log/export.csv', 'view:fleet', async (req, res) => {
      const q = { ...refrigerantLogQuerySchema.parse(req.query), before: undefined };
      const settings = await ctx.caches.settings.get(ctx.db);
      const totals = await logTotals(ctx.db, q, settings);
      const site = q.siteId ? `-site-${q.siteId}` : '';
      await sendCsv(
        res,
        `refrigerant-log-${q.from}-to-${q.to}${site}.csv`,
        [...LOG_CSV_COLUMNS],
        refrigerantLogCsvRecords(ctx.db, q, settings, totals),
        { note: refrigerantLogCsvNote(q, settings) },
      );
    }),
  ];
}
