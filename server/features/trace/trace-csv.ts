// The charges found as a CSV file.
import type { Db } from '../../db/client';
import { streamRows } from '../../lib/csv-stream';
import type { TraceQuery } from '../../../shared/schemas/trace';
import { traceChargesQuery } from './trace.service';
import { ENTRY_KIND_WORDS, wordFor } from '../../../shared/domain/words';

export const TRACE_CSV_COLUMNS = [
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

export async function* traceCsvRecords(db: Db, q: TraceQuery): AsyncIterable<unknown[]> {
  for await (const raw of streamRows(db, traceChargesQuery(db, q))) {
    // Order of traceChargeFields.
    const [eventId, , containerNumber, refrigerant, kind, kg, cylinder, occurredAt, , siteName, , technicianName] = raw;
    yield [
      occurredAt instanceof Date ? occurredAt.toISOString() : String(occurredAt),
      containerNumber,
      refrigerant,
      wordFor(ENTRY_KIND_WORDS, String(kind)),
      kg,
      cylinder ?? '',
      siteName ?? '',
      technicianName,
      eventId,
    ];
  }
}
