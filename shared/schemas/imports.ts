// CSV import of units.
import { z } from 'zod';
import { blankToNull } from './common';
import { statusSchema, unitDetailFields, unitFields } from './units';

export const MAX_IMPORT_BYTES = 25 * 1024 * 1024;
export const MAX_IMPORT_ROWS = 200_000;
export const IMPORT_SAMPLE_ROWS = 10;
export const MAX_REPORTED_IMPORT_ERRORS = 200;

/** The columns of the fleet CSV, in template order; `header` is the template's column name. */
export const IMPORT_COLUMNS = [
  { field: 'containerNumber', header: 'container_number', required: true, example: 'HRLU1000016' },
  { field: 'refrigerant', header: 'refrigerant', required: true, example: 'R-134a' },
  { field: 'nominalChargeKg', header: 'nominal_charge_kg', required: true, example: '4.5' },
  { field: 'commissionedOn', header: 'commissioned_on', required: false, example: '2021-03-15' },
  { field: 'siteCode', header: 'site_code', required: false, example: 'RTM-D1' },
  { field: 'status', header: 'status', required: false, example: 'in_service' },
  { field: 'machinerySerial', header: 'machinery_serial', required: false, example: 'MX-2021-004417' },
  { field: 'model', header: 'model', required: false, example: 'HX-40 Cold' },
  { field: 'manufactureYear', header: 'manufacture_year', required: false, example: '2020' },
  { field: 'purchaseCost', header: 'purchase_cost', required: false, example: '14800.00' },
  { field: 'residualValue', header: 'residual_value', required: false, example: '3500.00' },
  { field: 'notes', header: 'notes', required: false, example: 'Machinery replaced 2023' },
] as const;
export type ImportField = (typeof IMPORT_COLUMNS)[number]['field'];
export const IMPORT_FIELDS = IMPORT_COLUMNS.map((c) => c.field) as [ImportField, ...ImportField[]];

/** One CSV row, after column mapping: the same rules as registering a unit by hand, with the site by its code. */
export const importRowSchema = z.object({
  containerNumber: unitFields.containerNumber,
  refrigerant: unitFields.refrigerant,
  nominalChargeKg: unitFields.nominalChargeKg,
  commissionedOn: unitFields.commissionedOn.optional(),
  siteCode: z
    .preprocess(
      (v) => (typeof v === 'string' ? (v.trim() === '' ? null : v.trim().toUpperCase()) : v),
      z.string().max(16, 'A site code has at most 16 characters').nullable(),
    )
    .optional(),
  status: z.preprocess((v) => (blankToNull(v) === null ? undefined : v), statusSchema.optional()),
  ...unitDetailFields,
});
export type ImportRow = z.output<typeof importRowSchema>;

/** Which CSV column feeds which field; a field left out is not imported. */
export const importMappingSchema = z.partialRecord(z.enum(IMPORT_FIELDS), z.string().max(200));
export type ImportMapping = z.infer<typeof importMappingSchema>;

const jsonText = z
  .string()
  .max(20_000)
  .transform((s, ctx) => {
    try {
      return JSON.parse(s) as unknown;
    } catch {
      ctx.addIssue({ code: 'custom', message: 'Not valid JSON' });
      return z.NEVER;
    }
  });

/** The text fields that travel beside the file in the multipart upload. */
export const importPreviewFormSchema = z.object({
  mapping: jsonText.pipe(importMappingSchema).optional(),
});
export const importCommitFormSchema = importPreviewFormSchema.extend({
  importKey: z.string().regex(/^[A-Za-z0-9_-]{16,43}$/, 'An import key is 16–43 URL-safe characters'),
  skipExisting: z
    .enum(['true', 'false'])
    .transform((v) => v === 'true')
    .optional(),
});
export const importKeyParamSchema = z.object({ key: z.string().min(1).max(64) });

export const importRowErrorDto = z.object({
  row: z.number(),
  column: z.string().nullable(),
  field: z.string().nullable(),
  message: z.string(),
});
export type ImportRowErrorDto = z.infer<typeof importRowErrorDto>;

export const importPreviewDto = z.object({
  fileName: z.string(),
  columns: z.array(z.string()),
  mapping: importMappingSchema,
  totalRows: z.number(),
  sample: z.array(
    z.object({ row: z.number(), values: z.record(z.string(), z.string()), errors: z.array(importRowErrorDto) }),
  ),
  errors: z.array(importRowErrorDto),
  errorCount: z.number(),
  rowsWithErrors: z.number(),
  existing: z.array(z.object({ row: z.number(), containerNumber: z.string(), unitId: z.number() })),
  existingCount: z.number(),
  readyCount: z.number(),
});
export type ImportPreviewDto = z.infer<typeof importPreviewDto>;

export const IMPORT_STATUSES = ['running', 'committed', 'failed'] as const;
export const unitImportDto = z.object({
  key: z.string(),
  fileName: z.string(),
  status: z.enum(IMPORT_STATUSES),
  totalRows: z.number(),
  processedRows: z.number(),
  insertedRows: z.number(),
  message: z.string().nullable(),
  createdAt: z.string(),
  finishedAt: z.string().nullable(),
});
export type UnitImportDto = z.infer<typeof unitImportDto>;
export const unitImportResponseDto = z.object({ import: unitImportDto });
