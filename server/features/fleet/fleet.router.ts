import type { AppContext } from '../../deps';
import { route } from '../../routes';
import {
  fleetFiltersSchema,
  fleetOverviewQuerySchema,
  fleetQuerySchema,
  markForInspectionSchema,
  traceQuerySchema,
} from '../../../shared/schemas/fleet';
import {
  ensureStatsRows,
  refreshForecastIfStale,
  refreshRepairEffectivenessIfStale,
  startForecastCases,
  startRepairEffectiveness,
} from '../jobs/jobs.service';
import { dayText, sendCsv, streamRows } from './csv-stream';
import {
  countFleet,
  fleetSelect,
  listFleet,
  ROW_FIELD_NAMES,
  shouldForceSortIndex,
  todayOf,
  toFleetRow,
} from './fleet.service';
import { createOverviewCache, fleetOverview } from './overview.service';
import { markForInspection, traceCharges, traceChargesQuery } from './traceability.service';

const FLEET_CSV_COLUMNS = [
  'Container number',
  'Site',
  'Refrigerant',
  'Full charge (kg)',
  'Status',
  'Repeat-leak score',
  'Band',
  'Rolling leak rate (%)',
  'Charge (t CO2e)',
  'Next top-up forecast',
  'Forecast overdue',
  'Next leak check due',
  'Leak check overdue',
  'PTI valid until',
  'PTI valid',
  'Pressure health',
  'Last event',
  'Figures',
];

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

// The repair-effectiveness table's age is looked at on overview reads, at most this often.
const REPAIR_AGE_CHECK_MS = 60_000;

export function fleetRoutes(ctx: AppContext) {
  const overviewCache = createOverviewCache();
  let repairAgeCheckedAt = 0;
  return [
    route('get', '/api/fleet', 'view:fleet', async (req, res) => {
      const q = fleetQuerySchema.parse(req.query);
      await ensureStatsRows(ctx);
      res.json(await listFleet(ctx.db, q, ctx.clock.now()));
    }),
    route('get', '/api/fleet/count', 'view:fleet', async (req, res) => {
      const f = fleetFiltersSchema.parse(req.query);
      await ensureStatsRows(ctx);
      res.json(await countFleet(ctx.db, f, todayOf(ctx.clock.now())));
    }),
    route('get', '/api/fleet/export.csv', 'view:fleet', async (req, res) => {
      const q = fleetQuerySchema.parse(req.query);
      await ensureStatsRows(ctx);
      const today = todayOf(ctx.clock.now());
      const nullable = ['forecast', 'leakCheck', 'pti'].includes(q.sort) && q.dir === 'asc';
      const force = await shouldForceSortIndex(ctx.db, q);
      const parts = nullable
        ? [fleetSelect(ctx.db, q, today, 'none', force), fleetSelect(ctx.db, q, today, 'only')]
        : [fleetSelect(ctx.db, q, today, undefined, force)];
      async function* records() {
        for (const part of parts) {
          for await (const raw of streamRows(ctx.db, part)) {
            const r = toFleetRow(
              Object.fromEntries(ROW_FIELD_NAMES.map((k, i) => [k, raw[i]])) as Parameters<typeof toFleetRow>[0],
              today,
            );
            yield [
              r.containerNumber,
              r.site?.name ?? '',
              r.refrigerant,
              r.nominalChargeKg,
              r.status,
              r.score,
              r.scoreBand,
              r.rollingLeakRatePct,
              r.co2eTonnes,
              r.forecastDate ?? '',
              r.forecastDate ? r.forecastOverdue : '',
              r.nextLeakCheckDue ?? '',
              r.nextLeakCheckDue ? r.leakCheckOverdue : '',
              r.ptiValidUntil ?? '',
              r.ptiValid,
              r.pressureFlag,
              r.lastEventAt ?? '',
              r.computeError ? `cannot compute: ${r.computeError}` : 'computed',
            ];
          }
        }
      }
      await sendCsv(res, `fleet-${today}.csv`, FLEET_CSV_COLUMNS, records());
    }),
    route('get', '/api/fleet/overview', 'view:fleet', async (req, res) => {
      const q = fleetOverviewQuerySchema.parse(req.query);
      // Rebuilt in the background when old; this answer shows the figures as they are.
      if (Date.now() - repairAgeCheckedAt > REPAIR_AGE_CHECK_MS) {
        repairAgeCheckedAt = Date.now();
        void refreshRepairEffectivenessIfStale(ctx).catch((err: unknown) =>
          ctx.logger.warn({ err }, 'repair effectiveness refresh'),
        );
        // The forecast's case base, should no process have run its nightly refresh (DOMAIN.md §7b); the first one is
        // the start-up check's or the refresh button's to build.
        void refreshForecastIfStale(ctx, {
          firstBuild: false,
          message: 'Older than a day when the overview was read.',
        }).catch((err: unknown) => ctx.logger.warn({ err }, 'forecast case base refresh'));
      }
      res.json(await fleetOverview(ctx.db, q, ctx.clock.now(), overviewCache));
    }),
    route('post', '/api/fleet/repair-effectiveness/refresh', 'view:fleet', async (req, res) => {
      res.status(202).json({ job: await startRepairEffectiveness(ctx, req.user!.id) });
    }),
    // Learns the forecast's case base again from the whole fleet, measures it, then recomputes every forecast.
    route('post', '/api/fleet/forecast/refresh', 'view:fleet', async (req, res) => {
      res
        .status(202)
        .json({ job: await startForecastCases(ctx, { userId: req.user!.id, message: 'Asked for on the overview.' }) });
    }),
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
