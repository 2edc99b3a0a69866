// Reading a fleet CSV: refusing what is not CSV, decoding, finding the delimiter, and mapping columns to fields.
import { parse } from 'csv-parse/sync';
import { HttpError, badRequest } from '../../lib/http-error';
import { IMPORT_COLUMNS, MAX_IMPORT_ROWS, type ImportField, type ImportMapping } from '../../../shared/schemas/units';

export type FleetCsv = { columns: string[]; rows: string[][] };

const notCsv = (why: string) =>
  new HttpError(
    415,
    'not_csv',
    `${why} Upload the fleet as a CSV file (.csv); in a spreadsheet, use "Save as CSV UTF-8".`,
  );

/** Refuses a file by its name and type before it is read (multer's fileFilter). */
export function acceptCsvUpload(file: { originalname: string; mimetype: string }) {
  const byName = /\.csv$/i.test(file.originalname);
  const byType = file.mimetype === 'text/csv' || file.mimetype === 'application/csv';
  if (!byName && !byType) throw notCsv(`"${file.originalname}" is not a CSV file.`);
}

function decode(buffer: Buffer): string {
  if (buffer.subarray(0, 4).toString('latin1') === 'PK\u0003\u0004') {
    throw notCsv('This file is a spreadsheet workbook (or another zip archive), not CSV.');
  }
  if (buffer.subarray(0, 5).toString('latin1') === '%PDF-') throw notCsv('This file is a PDF, not CSV.');
  if (buffer.includes(0)) throw notCsv('This file contains binary data, not text.');
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(buffer);
  } catch {
    // Older spreadsheet programs save "CSV" in the Windows Western code page.
    return new TextDecoder('windows-1252').decode(buffer);
  }
}

/** Comma, semicolon (spreadsheets with a decimal comma) or tab: whichever the header line has most of. */
function detectDelimiter(text: string): string {
  const firstLine = text.slice(0, text.search(/\r?\n|$/));
  const counts = [',', ';', '\t'].map((d) => [d, firstLine.split(d).length - 1] as const);
  counts.sort((a, b) => b[1] - a[1]);
  return counts[0][1] > 0 ? counts[0][0] : ',';
}

export function readFleetCsv(buffer: Buffer): FleetCsv {
  const text = decode(buffer);
  let records: string[][];
  try {
    records = parse(text, {
      bom: true,
      delimiter: detectDelimiter(text),
      relax_column_count: true,
      skip_empty_lines: true,
      skip_records_with_empty_values: true,
      trim: true,
    }) as string[][];
  } catch (err) {
    throw badRequest(`The CSV could not be read: ${(err as Error).message}`);
  }
  if (records.length === 0)
    throw badRequest('The file is empty. Start from the template: a header row, then one unit per row.');
  const [header, ...rows] = records;
  const columns = header.map((h) => h.trim());
  const seen = new Set<string>();
  for (const c of columns) {
    if (c !== '' && seen.has(c.toLowerCase())) throw badRequest(`The column "${c}" appears twice in the header row.`);
    seen.add(c.toLowerCase());
  }
  if (rows.length === 0) throw badRequest('The file has a header row but no units below it.');
  if (rows.length > MAX_IMPORT_ROWS) {
    throw badRequest(
      `The file has ${rows.length} rows; import at most ${MAX_IMPORT_ROWS.toLocaleString('en')} at a time.`,
    );
  }
  return { columns, rows };
}

const squash = (s: string) => s.toLowerCase().replace(/[^a-z0-9]/g, '');

// Other words people use for the same column in their own spreadsheets.
const ALIASES: Partial<Record<ImportField, string[]>> = {
  containerNumber: ['container', 'containerno', 'unit', 'unitnumber', 'equipmentnumber', 'iso6346'],
  refrigerant: ['gas', 'refrigeranttype'],
  nominalChargeKg: ['charge', 'chargekg', 'fullcharge', 'fullchargekg', 'nominalcharge'],
  commissionedOn: ['commissioned', 'commissioningdate', 'inservicedate'],
  siteCode: ['site', 'location', 'depot'],
  machinerySerial: ['serial', 'machineserial', 'serialnumber'],
  manufactureYear: ['year', 'built', 'yearofmanufacture'],
  purchaseCost: ['cost', 'purchaseprice'],
  residualValue: ['residual'],
  notes: ['note', 'comment', 'comments', 'remarks'],
};

/** Template column names match exactly; otherwise the field name or a common alias, ignoring case and punctuation. */
export function suggestMapping(columns: string[]): ImportMapping {
  const byKey = new Map(columns.map((c) => [squash(c), c]));
  const mapping: ImportMapping = {};
  for (const col of IMPORT_COLUMNS) {
    const keys = [squash(col.header), squash(col.field), ...(ALIASES[col.field] ?? [])];
    const hit = keys.map((k) => byKey.get(k)).find((c) => c !== undefined);
    if (hit !== undefined) mapping[col.field] = hit;
  }
  return mapping;
}

/** The mapping as column indexes; a 400 naming the field when a required one is missing or a column is unknown. */
export function resolveMapping(columns: string[], mapping: ImportMapping): Map<ImportField, number> {
  const index = new Map<ImportField, number>();
  const fields: Record<string, string> = {};
  for (const col of IMPORT_COLUMNS) {
    const name = mapping[col.field];
    if (name === undefined || name === '') {
      if (col.required) fields[`mapping.${col.field}`] = `Choose the column that holds ${col.header}`;
      continue;
    }
    const i = columns.findIndex((c) => c === name);
    if (i < 0) fields[`mapping.${col.field}`] = `The file has no column "${name}"`;
    else index.set(col.field, i);
  }
  if (Object.keys(fields).length > 0) throw badRequest('Some columns need to be matched to fields.', fields);
  return index;
}
