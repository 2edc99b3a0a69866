import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { termLabel, LEAK_CHECK_METHODS, LEAK_LOCATIONS } from '../../../shared/domain';
import { refrigerantLogQuerySchema } from '../../../shared/schemas/refrigerant-log';
import { sendCsv, streamRows } from '../../lib/csv-stream';
import { LOG_FIELD_NAMES, logEntriesQuery, logTotals, refrigerantLog, toLogEntry } from './refrigerant-log.service';

const KIND_WORDS = {
  top_up: 'top-up',
  recharge: 'recharge after evacuation',
  recovery: 'recovery',
  leak_check: 'leak check',
} as const;

const CSV_COLUMNS = [
  'Date (UTC)',
  'Entry',
  'Container number',
  'Refrigerant',
  'Site',
  'kg',
  't CO2e',
  'Cylinder or lot',
  'Recycled or reclaimed gas',
  'First fill or retrofit',
  'Leak-check method',
  'Leak found',
  'Leak location',
  'Technician',
  'Certificate number',
  'Event id',
];

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
      async function* records() {
        for await (const raw of streamRows(ctx.db, logEntriesQuery(ctx.db, q))) {
          const e = toLogEntry(
            Object.fromEntries(LOG_FIELD_NAMES.map((k, i) => [k, raw[i]])) as Parameters<typeof toLogEntry>[0],
            settings,
          );
          yield [
            e.occurredAt,
            KIND_WORDS[e.kind],
            e.unit.containerNumber,
            e.refrigerant,
            e.site?.name ?? '',
            e.kg ?? '',
            e.co2eTonnes ?? '',
            e.cylinder ?? '',
            e.reusedRecovered ?? '',
            e.excludedFromLeakRate ?? '',
            e.method ? termLabel(LEAK_CHECK_METHODS, e.method) : '',
            e.leakFound ?? '',
            e.location ? termLabel(LEAK_LOCATIONS, e.location) : '',
            e.technician.name,
            e.technician.certificateNumber ?? '',
            e.eventId,
          ];
        }
        // Totals close the file, in the same columns, so the export is the whole record for the period.
        yield [];
        for (const t of totals) {
          yield [
            'Total',
            'added',
            '',
            t.refrigerant,
            '',
            t.addedKg,
            t.addedCo2eTonnes,
            '',
            '',
            '',
            '',
            '',
            '',
            '',
            '',
            `${t.additions} entries`,
          ];
          yield [
            'Total',
            'recovered',
            '',
            t.refrigerant,
            '',
            t.recoveredKg,
            t.recoveredCo2eTonnes,
            '',
            '',
            '',
            '',
            '',
            '',
            '',
            '',
            `${t.recoveries} entries`,
          ];
          yield [
            'Total',
            'leak checks',
            '',
            t.refrigerant,
            '',
            '',
            '',
            '',
            '',
            '',
            '',
            t.leaksFound ? `${t.leaksFound} found` : 'none found',
            '',
            '',
            '',
            `${t.leakChecks} entries`,
          ];
        }
        yield [`Period ${q.from} to ${q.to}; GWP basis ${settings.gwpBasis}; voided entries are excluded.`];
      }
      const site = q.siteId ? `-site-${q.siteId}` : '';
      await sendCsv(res, `refrigerant-log-${q.from}-to-${q.to}${site}.csv`, CSV_COLUMNS, records());
    }),
  ];
}
