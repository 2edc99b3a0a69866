import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { sendCsv } from '../../lib/csv-stream';
import { TRACE_CSV_COLUMNS, traceCsvRecords } from './trace-csv';
import { dayText } from '../../lib/dates';
import { markForInspectionSchema, traceQuerySchema } from '../../../shared/schemas/trace';
import { markForInspection, traceCharges } from './trace.service';

export function traceRoutes(ctx: AppContext) {
  return [
    route('get', '/api/traceability', 'view:fleet', async (req, res) => {
      const q = traceQuerySchema.parse(req.query);
      res.json(await traceCharges(ctx.db, q));
    }),
    route('get', '/api/traceability/export.csv', 'view:fleet', async (req, res) => {
      const q = traceQuerySchema.parse(req.query);
      const name = q.cylinder
        ? `cylinder-${q.cylinder.replace(/[^\w-]+/g, '_')}`
        : `site-${q.siteId}-${dayText(q.from)}-${dayText(q.to)}`;
      await sendCsv(res, `traceability-${name}.csv`, TRACE_CSV_COLUMNS, traceCsvRecords(ctx.db, q));
    }),
    route('post', '/api/traceability/mark-for-inspection', 'manage:units', async (req, res) => {
      const input = markForInspectionSchema.parse(req.body);
      const result = await markForInspection(ctx.db, req.user!, input, ctx.clock.now());
      res.status(result.replayed ? 200 : 201).json(result);
    }),
  ];
}
