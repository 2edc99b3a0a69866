// The refrigerant log as a CSV file: a comment line saying what it holds, the header, one row per entry, then the
// totals per refrigerant in the same columns. Nothing after them, so a machine reads every line as a record.
import type { Db } from '../../db/client';
import { streamRows } from '../../lib/csv-stream';
import { termLabel, LEAK_CHECK_METHODS, LEAK_LOCATIONS } from '../../../shared/domain';
import { ENTRY_KIND_WORDS } from '../../../shared/domain/words';
import type { RefrigerantLogQuery, RefrigerantLogTotalsDto } from '../../../shared/schemas/refrigerant-log';
import type { Settings } from '../../../shared/schemas/settings';
import { LOG_FIELD_NAMES, logEntriesQuery, toLogEntry } from './refrigerant-log.service';

export const LOG_CSV_COLUMNS = [
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
] as const;

/** The file's rows: the entries streamed from the database, then `totals` (read before the file starts). */
export async function* refrigerantLogCsvRecords(
  db: Db,
  q: RefrigerantLogQuery & { before?: undefined },
  settings: Settings,
  totals: RefrigerantLogTotalsDto[],
): AsyncIterable<unknown[]> {
  for await (const raw of streamRows(db, logEntriesQuery(db, q))) {
    const e = toLogEntry(
      Object.fromEntries(LOG_FIELD_NAMES.map((k, i) => [k, raw[i]])) as Parameters<typeof toLogEntry>[0],
      settings,
    );
    yield [
      e.occurredAt,
      ENTRY_KIND_WORDS[e.kind],
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
  for (const t of totals) {
    yield totalRow('added', t.refrigerant, { kg: t.addedKg, 't CO2e': t.addedCo2eTonnes }, `${t.additions} entries`);
    yield totalRow(
      'recovered',
      t.refrigerant,
      { kg: t.recoveredKg, 't CO2e': t.recoveredCo2eTonnes },
      `${t.recoveries} entries`,
    );
    yield totalRow(
      'leak checks',
      t.refrigerant,
      { 'Leak found': t.leaksFound ? `${t.leaksFound} found` : 'none found' },
      `${t.leakChecks} entries`,
    );
  }
}

type LogColumn = (typeof LOG_CSV_COLUMNS)[number];

/** A totals row: cells placed by column name, the count in the last column, the rest empty. */
function totalRow(what: string, refrigerant: string, cells: Partial<Record<LogColumn, unknown>>, count: string) {
  const row: Partial<Record<LogColumn, unknown>> = {
    'Date (UTC)': 'Total',
    Entry: what,
    Refrigerant: refrigerant,
    ...cells,
    'Event id': count,
  };
  return LOG_CSV_COLUMNS.map((c) => row[c] ?? '');
}

/** The file's first line, a comment (`#`) that CSV readers can skip: what the file holds. */
export function refrigerantLogCsvNote(q: RefrigerantLogQuery, settings: Settings): string {
  return `Refrigerant log, period ${q.from} to ${q.to}; GWP basis ${settings.gwpBasis}; voided entries are excluded; rows whose Date (UTC) reads "Total" are the totals per refrigerant.`;
}
