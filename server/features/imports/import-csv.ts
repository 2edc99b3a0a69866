// Reading a fleet CSV: the file itself is read by server/lib/csv-read.ts; here the fleet columns are matched to fields.
import { badRequest } from '../../lib/http-error';
import { readCsvTable, type CsvTable } from '../../lib/csv-read';
import { IMPORT_COLUMNS, MAX_IMPORT_ROWS, type ImportField, type ImportMapping } from '../../../shared/schemas/imports';

export type FleetCsv = CsvTable;

export async function readFleetCsv(file: string): Promise<FleetCsv> {
  return readCsvTable(file, { maxRows: MAX_IMPORT_ROWS, noun: 'unit' });
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
