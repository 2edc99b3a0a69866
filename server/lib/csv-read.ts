// Reading an uploaded CSV: refusing what is not CSV, decoding, finding the delimiter, the header row. The file is
// parsed as a stream from disk, a chunk at a time, so a 25 MB import never holds the event loop for long and other
// requests keep being answered while it is read. Used by the unit import and the cylinder import.
import { createReadStream } from 'node:fs';
import { open } from 'node:fs/promises';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { CsvError, parse } from 'csv-parse';
import { HttpError, badRequest } from './http-error';

const notCsv = (why: string) =>
  new HttpError(415, 'not_csv', `${why} Upload a CSV file (.csv); in a spreadsheet, use "Save as CSV UTF-8".`);

/** Refuses a file by its name and type before it is read (multer's fileFilter). */
export function acceptCsvUpload(file: { originalname: string; mimetype: string }) {
  const byName = /\.csv$/i.test(file.originalname);
  const byType = file.mimetype === 'text/csv' || file.mimetype === 'application/csv';
  if (!byName && !byType) throw notCsv(`"${file.originalname}" is not a CSV file.`);
}

/** Refuses a file by its first bytes, while it is still arriving: workbooks and PDFs renamed .csv. */
export function acceptCsvHead(head: Buffer) {
  if (head.subarray(0, 4).toString('latin1') === 'PK\u0003\u0004') {
    throw notCsv('This file is a spreadsheet workbook (or another zip archive), not CSV.');
  }
  if (head.subarray(0, 5).toString('latin1') === '%PDF-') throw notCsv('This file is a PDF, not CSV.');
}

/** Comma, semicolon (spreadsheets with a decimal comma) or tab: whichever the header line has most of. */
function detectDelimiter(text: string): string {
  const firstLine = text.slice(0, text.search(/\r?\n|$/));
  const counts = [',', ';', '\t'].map((d) => [d, firstLine.split(d).length - 1] as const);
  counts.sort((a, b) => b[1] - a[1]);
  return counts[0][1] > 0 ? counts[0][0] : ',';
}

/** The first bytes of the file: enough for its signature and its header line. */
async function readHead(file: string, bytes = 64 * 1024): Promise<Buffer> {
  const handle = await open(file, 'r');
  try {
    const buf = Buffer.alloc(bytes);
    const { bytesRead } = await handle.read(buf, 0, bytes, 0);
    return buf.subarray(0, bytesRead);
  } finally {
    await handle.close();
  }
}

class NotUtf8 extends Error {}

/**
 * Passes the bytes on as UTF-8, refusing binary data. As UTF-8 it only checks them (a NotUtf8 error on the first
 * invalid sequence); as windows-1252 it converts them.
 */
function textChecker(encoding: 'utf-8' | 'windows-1252') {
  const decoder = new TextDecoder(encoding, { fatal: encoding === 'utf-8' });
  return new Transform({
    transform(chunk: Buffer, _enc, done) {
      if (chunk.includes(0)) return done(notCsv('This file contains binary data, not text.'));
      if (encoding === 'windows-1252') return done(null, Buffer.from(decoder.decode(chunk, { stream: true })));
      try {
        decoder.decode(chunk, { stream: true });
      } catch {
        return done(new NotUtf8());
      }
      done(null, chunk);
    },
    flush(done) {
      try {
        decoder.decode();
        done();
      } catch {
        done(new NotUtf8());
      }
    },
  });
}

/**
 * One string for each repeated short value (a refrigerant, a site code, a date): a fleet file repeats most of its
 * cells, and 200,000 rows of separate copies make the garbage collector stall the whole API for tenths of a second.
 */
function stringPool(maxEntries = 50_000, maxLength = 40) {
  const pool = new Map<string, string>();
  return (value: string) => {
    if (value.length > maxLength) return value;
    const known = pool.get(value);
    if (known !== undefined) return known;
    if (pool.size < maxEntries) pool.set(value, value);
    return value;
  };
}

async function parseFile(file: string, encoding: 'utf-8' | 'windows-1252', delimiter: string, maxRows: number) {
  const shared = stringPool();
  const records: string[][] = [];
  let count = 0;
  await pipeline(
    createReadStream(file, { highWaterMark: 16 * 1024 }),
    textChecker(encoding),
    parse({
      bom: true,
      delimiter,
      relax_column_count: true,
      skip_empty_lines: true,
      skip_records_with_empty_values: true,
      trim: true,
    }),
    async (source: AsyncIterable<string[]>) => {
      // Past the limit rows are only counted, so the refusal can say how many there are.
      for await (const record of source) {
        if (count++ > maxRows) continue;
        for (let i = 0; i < record.length; i++) record[i] = shared(record[i]);
        records.push(record);
      }
    },
  );
  return { records, count };
}

export type CsvTable = { columns: string[]; rows: string[][] };

/**
 * A CSV upload read from disk as a stream: refused when it is not text, decoded as UTF-8 or else windows-1252, the
 * delimiter found, a header row with distinct names required, and at most `maxRows` data rows (`noun` names a row in
 * the messages: "unit", "cylinder").
 */
export async function readCsvTable(
  file: string,
  { maxRows, noun }: { maxRows: number; noun: string },
): Promise<CsvTable> {
  const head = await readHead(file);
  acceptCsvHead(head);
  // The delimiter is the same byte in both encodings; the header line is in the first 64 KB.
  const delimiter = detectDelimiter(new TextDecoder('utf-8').decode(head));
  let parsed: { records: string[][]; count: number };
  try {
    try {
      parsed = await parseFile(file, 'utf-8', delimiter, maxRows);
    } catch (err) {
      if (!(err instanceof NotUtf8)) throw err;
      // Older spreadsheet programs save "CSV" in the Windows Western code page.
      parsed = await parseFile(file, 'windows-1252', delimiter, maxRows);
    }
  } catch (err) {
    if (err instanceof CsvError) throw badRequest(`The CSV could not be read: ${err.message}`);
    throw err;
  }
  const { records, count } = parsed;
  if (records.length === 0)
    throw badRequest(`The file is empty. Start from the template: a header row, then one ${noun} per row.`);
  const [header, ...rows] = records;
  const columns = header.map((h) => h.trim());
  const seen = new Set<string>();
  for (const c of columns) {
    if (c !== '' && seen.has(c.toLowerCase())) throw badRequest(`The column "${c}" appears twice in the header row.`);
    seen.add(c.toLowerCase());
  }
  if (rows.length === 0) throw badRequest(`The file has a header row but no ${noun}s below it.`);
  if (count - 1 > maxRows) {
    throw badRequest(
      `The file has ${(count - 1).toLocaleString('en')} rows; import at most ${maxRows.toLocaleString('en')} at a time.`,
    );
  }
  return { columns, rows };
}
