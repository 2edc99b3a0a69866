// The fleet table as a CSV file, streamed in the table's order.
import type { Db } from '../../db/client';
import { streamRows } from '../../lib/csv-stream';
import type { FleetQuery } from '../../../shared/schemas/fleet';
import { UNIT_STATUS_LABELS } from '../../../shared/schemas/units';
import { PRESSURE_FLAG_WORDS, SCORE_BAND_WORDS } from '../../../shared/domain/words';
import { fleetSelect, ROW_FIELD_NAMES, toFleetRow } from './fleet.service';

export const FLEET_CSV_COLUMNS = [
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

/** Ascending by a column that may be empty, the filled rows come first and the empty ones after (as on screen). */
export async function* fleetCsvRecords(
  db: Db,
  q: FleetQuery,
  today: string,
  forceSortIndex: boolean,
): AsyncIterable<unknown[]> {
  const nullable = ['forecast', 'leakCheck', 'pti'].includes(q.sort) && q.dir === 'asc';
  const parts = nullable
    ? [fleetSelect(db, q, today, 'none', forceSortIndex), fleetSelect(db, q, today, 'only')]
    : [fleetSelect(db, q, today, undefined, forceSortIndex)];
  for (const part of parts) {
    for await (const raw of streamRows(db, part)) {
      const r = toFleetRow(
        Object.fromEntries(ROW_FIELD_NAMES.map((k, i) => [k, raw[i]])) as Parameters<typeof toFleetRow>[0],
        today,
      );
      yield [
        r.containerNumber,
        r.site?.name ?? '',
        r.refrigerant,
        r.nominalChargeKg,
        // The screens' words, not the internal codes.
        UNIT_STATUS_LABELS[r.status],
        r.score,
        SCORE_BAND_WORDS[r.scoreBand].label,
        r.rollingLeakRatePct,
        r.co2eTonnes,
        r.forecastDate ?? '',
        r.forecastDate ? r.forecastOverdue : '',
        r.nextLeakCheckDue ?? '',
        r.nextLeakCheckDue ? r.leakCheckOverdue : '',
        r.ptiValidUntil ?? '',
        r.ptiValid,
        PRESSURE_FLAG_WORDS[r.pressureFlag],
        r.lastEventAt ?? '',
        r.computeError ? `cannot compute: ${r.computeError}` : 'computed',
      ];
    }
  }
}
