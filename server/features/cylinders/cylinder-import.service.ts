// CSV import of existing cylinders: all or nothing. Every row is checked with the register's own field rule
// (cylinderImportRowSchema, the form's rule with a site code); one bad row refuses the file with every row's errors.
import { inArray } from 'drizzle-orm';
import { stringify } from 'csv-stringify/sync';
import { cylinders, sites } from '../../db/schema';
import { CSV_OPTIONS } from '../../lib/csv';
import { readCsvTable } from '../../lib/csv-read';
import { HttpError } from '../../lib/http-error';
import type { AppContext } from '../../lib/app-context';
import type { SessionUser } from '../../lib/session';
import {
  CYLINDER_IMPORT_COLUMNS,
  MAX_CYLINDER_IMPORT_ROWS,
  cylinderImportRowSchema,
  type CylinderImportResultDto,
  type CylinderImportRowError,
} from '../../../shared/schemas/cylinders';
import { insertCylinders, type NewCylinder } from './cylinders.service';

/** Errors carried in the refusal's `fields`. */
const MAX_REPORTED = 200;
const squash = (s: string) => s.toLowerCase().replace(/[^a-z0-9]/g, '');
// Other words people use for the same column.
const ALIASES: Record<string, string[]> = {
  code: ['cylinder', 'cylindernumber', 'number', 'serial', 'id'],
  tareKg: ['tare', 'tareweight'],
  capacityKg: ['capacity', 'maxfill', 'maximumfill', 'maxfillkg'],
  grossKg: ['gross', 'grossweight', 'weight'],
  gasOrigin: ['origin', 'gas'],
  siteCode: ['site', 'depot'],
  refrigerant: ['refrigeranttype'],
};

export function cylinderTemplateCsv(): string {
  return stringify(
    [
      [...CYLINDER_IMPORT_COLUMNS],
      ['RC-1001', 'recovery', 'R-134a', 14.2, 22.5, 14.2, '', 'Coldchain Gas Supply', '', 'HRB', 'empty', ''],
      ['NC-2001', 'new', 'R-134a', 12.1, 13.6, 25.7, 'virgin', 'Coldchain Gas Supply', 'L24-0917', 'HRB', 'full', ''],
    ],
    CSV_OPTIONS,
  );
}

export async function importCylinders(
  ctx: AppContext,
  user: SessionUser,
  file: { path: string },
): Promise<CylinderImportResultDto> {
  const csv = await readCsvTable(file.path, { maxRows: MAX_CYLINDER_IMPORT_ROWS, noun: 'cylinder' });
  const byKey = new Map(csv.columns.map((c, i) => [squash(c), i]));
  const index = new Map<string, number>();
  for (const field of CYLINDER_IMPORT_COLUMNS) {
    const hit = [squash(field), ...(ALIASES[field] ?? [])].map((k) => byKey.get(k)).find((i) => i !== undefined);
    if (hit !== undefined) index.set(field, hit);
  }
  const missing = (['kind', 'refrigerant', 'tareKg', 'capacityKg'] as const).filter((f) => !index.has(f));
  if (missing.length) {
    throw new HttpError(
      400,
      'invalid_input',
      `The file needs the columns ${missing.join(', ')} (start from the template).`,
      Object.fromEntries(missing.map((f) => [`columns.${f}`, 'Missing column'])),
    );
  }
  const siteRows = await ctx.db.select({ id: sites.id, code: sites.code }).from(sites);
  const siteByCode = new Map(siteRows.map((s) => [s.code.toUpperCase(), s.id]));
  const errors: CylinderImportRowError[] = [];
  const valid: NewCylinder[] = [];
  const seen = new Map<string, number>();
  csv.rows.forEach((cells, i) => {
    const row = i + 2; // the header is row 1
    const raw: Record<string, string | undefined> = {};
    for (const [field, col] of index) raw[field] = cells[col];
    const parsed = cylinderImportRowSchema.safeParse(raw);
    if (!parsed.success) {
      const fields = new Set<string>();
      for (const issue of parsed.error.issues) {
        const field = String(issue.path[0] ?? '');
        if (fields.has(field)) continue;
        fields.add(field);
        errors.push({ row, field: field || null, message: issue.message });
      }
      return;
    }
    const { siteCode, ...rest } = parsed.data;
    let siteId: number | null = null;
    if (siteCode) {
      const found = siteByCode.get(siteCode);
      if (found === undefined) {
        errors.push({ row, field: 'siteCode', message: `No site has the code ${siteCode}` });
        return;
      }
      siteId = found;
    }
    if (rest.code) {
      const first = seen.get(rest.code);
      if (first !== undefined) {
        errors.push({ row, field: 'code', message: `Cylinder ${rest.code} is also on row ${first}` });
        return;
      }
      seen.set(rest.code, row);
    }
    valid.push({ ...rest, siteId });
  });
  const codes = [...seen.keys()];
  for (let i = 0; i < codes.length; i += 1000) {
    const known = await ctx.db
      .select({ code: cylinders.code })
      .from(cylinders)
      .where(inArray(cylinders.code, codes.slice(i, i + 1000)));
    for (const k of known) {
      errors.push({ row: seen.get(k.code)!, field: 'code', message: `Cylinder ${k.code} is already in the register` });
    }
  }
  if (errors.length) {
    errors.sort((a, b) => a.row - b.row);
    const fields: Record<string, string> = {};
    for (const e of errors.slice(0, MAX_REPORTED)) fields[`rows.${e.row}.${e.field ?? 'row'}`] = e.message;
    const rows = new Set(errors.map((e) => e.row)).size;
    throw new HttpError(
      400,
      'invalid_rows',
      `${rows} of ${csv.rows.length} rows have errors; nothing was imported. Fix them and upload the file again.`,
      fields,
    );
  }
  const ids = await ctx.db.transaction((tx) => insertCylinders(tx, user, valid, ctx.clock.now()));
  return { imported: ids.length, cylinderIds: ids };
}
