// CSV exports streamed straight from MariaDB: rows flow through csv-stringify to the response with backpressure,
// so a 100,000-row export never sits in memory.
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Response } from 'express';
import type { Pool as CorePool } from 'mysql2';
import { stringify } from 'csv-stringify';
import type { Db } from '../db/client';
import { CSV_OPTIONS } from './csv';

type Compiled = { toSQL(): { sql: string; params: unknown[] } };

/** The rows of a Drizzle select as a stream of arrays, in the order of its select list. */
export function streamRows(db: Db, query: Compiled): AsyncIterable<unknown[]> {
  const { pool } = db.$client as unknown as { pool: CorePool };
  const { sql, params } = query.toSQL();
  return pool
    .query({ sql, values: params, rowsAsArray: true })
    .stream({ highWaterMark: 256 }) as unknown as AsyncIterable<unknown[]>;
}

/**
 * Sends `records` as a CSV attachment (UTF-8 with a byte-order mark, so spreadsheet programs read accents right).
 * An optional `note` becomes a first comment line. Cells follow the CSV injection rule of server/lib/csv.ts: formula-leading text escaped, numbers as numbers.
 */
export async function sendCsv(
  res: Response,
  fileName: string,
  columns: string[],
  records: AsyncIterable<unknown[]>,
  opts: { note?: string } = {},
): Promise<void> {
  res.setHeader('Content-Type', 'text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${fileName}"`);
  res.setHeader('Cache-Control', 'no-store');
  // A note goes on a first comment line ("# …", one line), never as a free-text record among the data.
  if (opts.note) res.write(`\uFEFF# ${opts.note.replace(/^#\s*/, '').replace(/[\r\n]+/g, ' ')}\n`);
  // The injection rule lives in CSV_OPTIONS, so no export can forget it.
  const csv = stringify({ ...CSV_OPTIONS, header: true, columns, bom: !opts.note });
  await pipeline(Readable.from(records), csv, res);
}
