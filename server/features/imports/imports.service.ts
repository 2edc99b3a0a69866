import { asc, eq, inArray } from 'drizzle-orm';
import { stringify } from 'csv-stringify/sync';
import type { Db, DbOrTx } from '../../db/client';
import { sites, unitImports, units } from '../../db/schema';
import { isDuplicateKeyError } from '../../lib/db-errors';
import { CSV_OPTIONS } from '../../lib/csv';
import { HttpError, badRequest, conflict, notFound } from '../../lib/http-error';
import { containerCheckDigit, formatContainerNumber } from '../../../shared/domain';
import {
  IMPORT_COLUMNS,
  IMPORT_SAMPLE_ROWS,
  MAX_REPORTED_IMPORT_ERRORS,
  importRowSchema,
  type ImportField,
  type ImportMapping,
  type ImportPreviewDto,
  type ImportRow,
  type ImportRowErrorDto,
  type UnitImportDto,
} from '../../../shared/schemas/imports';
import type { AppContext } from '../../lib/app-context';
import { registerNewUnits } from '../../lib/record/write-path';
import { newUnitRow } from '../../lib/record/new-unit';
import { readFleetCsv, resolveMapping, suggestMapping, type FleetCsv } from './import-csv';

/** Rows per INSERT: large enough to be fast, small enough to stay far below max_allowed_packet. */
const INSERT_CHUNK = 2000;
const LOOKUP_CHUNK = 1000;
/** Errors carried in a refused commit's `fields`; the preview lists many more. */
const MAX_ERRORS_IN_FIELDS = 50;
/** Rows checked between two turns of the event loop (a few milliseconds of work). */
const YIELD_EVERY_ROWS = 250;

/** An upload streamed to a temporary file (middleware/upload.ts). */
type UploadedFile = { originalname: string; path: string };
type ValidRow = { row: number; data: ImportRow; siteId: number | null };

type Checked = {
  csv: FleetCsv;
  mapping: ImportMapping;
  valid: ValidRow[];
  errors: ImportRowErrorDto[];
  rowsWithErrors: number;
};

/** Spreadsheet row number of a data row: the header is row 1. */
const rowNumber = (index: number) => index + 2;

async function checkRows(db: DbOrTx, file: UploadedFile, requested: ImportMapping | undefined): Promise<Checked> {
  const csv = await readFleetCsv(file.path);
  const mapping = requested ?? suggestMapping(csv.columns);
  const index = resolveMapping(csv.columns, mapping);
  const siteRows = await db.select({ id: sites.id, code: sites.code }).from(sites);
  const siteByCode = new Map(siteRows.map((s) => [s.code.toUpperCase(), s.id]));
  const firstRowOf = new Map<string, number>();
  const valid: ValidRow[] = [];
  const errors: ImportRowErrorDto[] = [];
  let rowsWithErrors = 0;

  for (const [i, cells] of csv.rows.entries()) {
    // Let other requests in between: checking 200,000 rows takes a second or more of CPU.
    if (i > 0 && i % YIELD_EVERY_ROWS === 0) await new Promise((resolve) => setImmediate(resolve));
    const row = rowNumber(i);
    const raw: Record<string, string | undefined> = {};
    for (const [field, col] of index) raw[field] = cells[col];
    const rowErrors: ImportRowErrorDto[] = [];
    const parsed = importRowSchema.safeParse(raw);
    if (!parsed.success) {
      const seen = new Set<string>();
      for (const issue of parsed.error.issues) {
        const field = String(issue.path[0] ?? '');
        if (seen.has(field)) continue;
        seen.add(field);
        rowErrors.push({
          row,
          column: mapping[field as ImportField] ?? null,
          field: field || null,
          message: issue.message,
        });
      }
    }
    // The site is checked even when other cells failed, so one pass over the file shows every problem of a row.
    const siteCode = raw.siteCode?.trim().toUpperCase();
    const siteId = siteCode ? (siteByCode.get(siteCode) ?? null) : null;
    if (siteCode && siteId === null && !rowErrors.some((e) => e.field === 'siteCode')) {
      rowErrors.push({
        row,
        column: mapping.siteCode ?? null,
        field: 'siteCode',
        message: `No site has the code "${siteCode}"; add it under Sites first`,
      });
    }
    if (parsed.success) {
      const { containerNumber } = parsed.data;
      const first = firstRowOf.get(containerNumber);
      if (first !== undefined) {
        rowErrors.push({
          row,
          column: mapping.containerNumber ?? null,
          field: 'containerNumber',
          message: `${formatContainerNumber(containerNumber)} is also on row ${first}`,
        });
      } else {
        firstRowOf.set(containerNumber, row);
      }
    }
    if (rowErrors.length > 0) {
      rowsWithErrors += 1;
      errors.push(...rowErrors);
    } else if (parsed.success) {
      valid.push({ row, data: parsed.data, siteId });
    }
  }
  return { csv, mapping, valid, errors, rowsWithErrors };
}

/** Rows whose container number is already registered. */
async function findExisting(db: DbOrTx, valid: ValidRow[]) {
  const found: { row: number; containerNumber: string; unitId: number }[] = [];
  for (let i = 0; i < valid.length; i += LOOKUP_CHUNK) {
    const chunk = valid.slice(i, i + LOOKUP_CHUNK);
    const rows = await db
      .select({ id: units.id, containerNumber: units.containerNumber })
      .from(units)
      .where(
        inArray(
          units.containerNumber,
          chunk.map((r) => r.data.containerNumber),
        ),
      );
    if (rows.length === 0) continue;
    const idOf = new Map(rows.map((r) => [r.containerNumber, r.id]));
    for (const r of chunk) {
      const unitId = idOf.get(r.data.containerNumber);
      if (unitId !== undefined) found.push({ row: r.row, containerNumber: r.data.containerNumber, unitId });
    }
  }
  return found;
}

export async function previewImport(
  db: Db,
  file: UploadedFile,
  mapping: ImportMapping | undefined,
): Promise<ImportPreviewDto> {
  const checked = await checkRows(db, file, mapping);
  const existing = await findExisting(db, checked.valid);
  const index = resolveMapping(checked.csv.columns, checked.mapping);
  const sample = checked.csv.rows.slice(0, IMPORT_SAMPLE_ROWS).map((cells, i) => {
    const row = rowNumber(i);
    const values: Record<string, string> = {};
    for (const [field, col] of index) values[field] = cells[col] ?? '';
    return { row, values, errors: checked.errors.filter((e) => e.row === row) };
  });
  return {
    fileName: file.originalname,
    columns: checked.csv.columns,
    mapping: checked.mapping,
    totalRows: checked.csv.rows.length,
    sample,
    errors: checked.errors.slice(0, MAX_REPORTED_IMPORT_ERRORS),
    errorCount: checked.errors.length,
    rowsWithErrors: checked.rowsWithErrors,
    existing: existing.slice(0, MAX_REPORTED_IMPORT_ERRORS),
    existingCount: existing.length,
    readyCount: checked.valid.length - existing.length,
  };
}

function toImportDto(r: typeof unitImports.$inferSelect): UnitImportDto {
  return {
    key: r.importKey,
    fileName: r.fileName,
    status: r.status,
    totalRows: r.totalRows,
    processedRows: r.processedRows,
    insertedRows: r.insertedRows,
    message: r.message ?? null,
    createdAt: new Date(r.createdAt).toISOString(),
    finishedAt: r.finishedAt ? new Date(r.finishedAt).toISOString() : null,
  };
}

export async function getImport(db: Db, key: string): Promise<UnitImportDto> {
  const [row] = await db.select().from(unitImports).where(eq(unitImports.importKey, key));
  if (!row) throw notFound('No such import.');
  return toImportDto(row);
}

type CommitOptions = { importKey: string; mapping?: ImportMapping; skipExisting?: boolean };

/**
 * Imports every row or none: all rows are checked first, then inserted in chunks inside one transaction. Progress
 * goes to the unit_imports row through other connections of the pool, so a poll sees it while the transaction runs.
 */
export async function commitImport(
  ctx: Pick<AppContext, 'db' | 'logger' | 'clock' | 'caches'>,
  actorId: string,
  file: UploadedFile,
  opts: CommitOptions,
): Promise<UnitImportDto> {
  const { db, logger } = ctx;
  const now = () => ctx.clock.now();
  const checked = await checkRows(db, file, opts.mapping);
  const total = checked.csv.rows.length;
  try {
    await db.insert(unitImports).values({
      importKey: opts.importKey,
      userId: actorId,
      fileName: file.originalname.slice(0, 255),
      totalRows: total,
      createdAt: now(),
    });
  } catch (err) {
    if (isDuplicateKeyError(err))
      throw conflict('This import has already been started.', { importKey: 'Already used' });
    throw err;
  }
  const progress = (values: Partial<typeof unitImports.$inferInsert>) =>
    db.update(unitImports).set(values).where(eq(unitImports.importKey, opts.importKey));

  try {
    if (checked.errors.length > 0) {
      const fields: Record<string, string> = {};
      for (const e of checked.errors.slice(0, MAX_ERRORS_IN_FIELDS))
        fields[`rows.${e.row}.${e.field ?? '_'}`] = e.message;
      throw badRequest(
        `${checked.rowsWithErrors} of ${total} rows need fixing; nothing was imported. Preview the file to see every problem.`,
        fields,
      );
    }
    const inserted = await db
      .transaction(async (tx) => {
        const existing = await findExisting(tx, checked.valid);
        if (existing.length > 0 && !opts.skipExisting) {
          const fields: Record<string, string> = {};
          for (const e of existing.slice(0, MAX_ERRORS_IN_FIELDS))
            fields[`rows.${e.row}.containerNumber`] = 'Already registered';
          throw conflict(
            `${existing.length} unit${existing.length === 1 ? ' is' : 's are'} already registered; nothing was imported. Skip them or take them out of the file.`,
            fields,
          );
        }
        const skip = new Set(existing.map((e) => e.row));
        const rows = checked.valid.filter((r) => !skip.has(r.row));
        const at = now();
        for (let i = 0; i < rows.length; i += INSERT_CHUNK) {
          const chunk = rows.slice(i, i + INSERT_CHUNK);
          await tx.insert(units).values(chunk.map(({ data, siteId }) => newUnitRow(data, siteId, at)));
          // Their first figures and change records in the same transaction (the unit write path's rule for new units).
          const ids = await tx
            .select({ id: units.id })
            .from(units)
            .where(
              inArray(
                units.containerNumber,
                chunk.map((r) => r.data.containerNumber),
              ),
            );
          await registerNewUnits(
            tx,
            ctx,
            actorId,
            ids.map((r) => r.id),
            at,
            `Imported from ${file.originalname}`.slice(0, 200),
          );
          await progress({ processedRows: Math.min(total, skip.size + i + chunk.length) });
        }
        return rows.length;
      })
      .finally(() => ctx.caches.fleetSize.invalidate());
    await progress({ status: 'committed', processedRows: total, insertedRows: inserted, finishedAt: now() });
  } catch (err) {
    const refused =
      err instanceof HttpError
        ? err
        : isDuplicateKeyError(err)
          ? conflict('A unit in the file was registered by someone else meanwhile; nothing was imported. Try again.')
          : null;
    await progress({
      status: 'failed',
      message: (refused?.message ?? 'The import failed on our side.').slice(0, 500),
      finishedAt: now(),
    }).catch((e: unknown) => logger.warn({ err: e }, 'could not mark the import failed'));
    throw refused ?? err;
  }
  return getImport(db, opts.importKey);
}

/** The template: the header row and two example units (valid check digits; an existing site's code when there is one). */
export async function importTemplateCsv(db: Db): Promise<string> {
  const [site] = await db.select({ code: sites.code }).from(sites).orderBy(asc(sites.code)).limit(1);
  const example = (serial: string) => {
    const first10 = `HRLU${serial}`;
    return `${first10}${containerCheckDigit(first10)}`;
  };
  const rows = [
    IMPORT_COLUMNS.map((c) => c.header),
    IMPORT_COLUMNS.map((c) =>
      c.field === 'containerNumber' ? example('100001') : c.field === 'siteCode' ? (site?.code ?? '') : c.example,
    ),
    IMPORT_COLUMNS.map((c) =>
      c.field === 'containerNumber'
        ? example('100002')
        : c.field === 'refrigerant'
          ? 'R-513A'
          : c.field === 'siteCode'
            ? (site?.code ?? '')
            : c.required
              ? c.example
              : '',
    ),
  ];
  return stringify(rows, CSV_OPTIONS);
}
