import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { sendCsv, streamRows } from '../../lib/csv-stream';
import { dayText } from '../../lib/dates';
import { markForInspectionSchema, traceQuerySchema } from '../../../shared/schemas/trace';
import { markForInspection, traceCharges, traceChargesQuery } from './trace.service';

const TRACE_CSV_COLUMNS = [
  'Date',
  'Container number',
  'Refrigerant',
  'Entry',
  'kg',
  'Cylinder or lot',
  'Site',
  'Recorded by',
  'Event id',
];

export function traceRoutes(ctx: AppContext) {
  return [
    route('get', '/api/traceability', 'view:fleet', async (req, res) => {
      const q = traceQuerySchema.parse(req.query);
      res.json(await traceCharges(ctx.db, q));
    }),
    route('get', '/api/traceability/export.csv', 'view:fleet', async (req, res) => {
      const q = traceQuerySchema.parse(req.query);
      async function* records() {
        for await (const raw of streamRows(ctx.db, traceChargesQuery(ctx.db, q))) {
          // Order of traceChargeFields.
          const [
            eventId,
            ,
            containerNumber,
            refrigerant,
            kind,
            kg,
            cylinder,
            occurredAt,
            ,
            siteName,
            ,
            technicianName,
          ] = raw;
          yield [
            occurredAt instanceof Date ? occurredAt.toISOString() : String(occurredAt),
            containerNumber,
            refrigerant,
            kind === 'top_up' ? 'top-up' : 'recharge',
            kg,
            cylinder ?? '',
            siteName ?? '',
            technicianName,
            eventId,
          ];
        }
      }
      const name = q.cylinder
        ? `cylinder-${q.cylinder.replace(/[^\w-]+/g, '_')}`
        : `site-${q.siteId}-${dayText(q.from)}-${dayText(q.to)}`;
      await sendCsv(res, `traceability-${name}.csv`, TRACE_CSV_COLUMNS, records());
    }),
    route('post', '/api/traceability/mark-for-inspection', 'manage:units', async (req, res) => {
      const input = markForInspectionSchema.parse(req.body);
      const result = await markForInspection(ctx.db, req.user!, input, ctx.clock.now());
      res.status(result.replayed ? 200 : 201).json(result);
    }),
  ];
}
