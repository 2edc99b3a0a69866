import { z } from 'zod';
import { findRefrigerant, normalizeContainerNumber, parseContainerNumber, REFRIGERANT_CODES } from '../domain';
import { daySchema, EARLIEST_RECORD_DAY } from './common';
import { SITE_KINDS } from './sites';

export const UNIT_STATUSES = ['in_service', 'out_of_service', 'retired'] as const;
export type UnitStatus = (typeof UNIT_STATUSES)[number];

export const UNIT_STATUS_LABELS: Record<UnitStatus, string> = {
  in_service: 'In service',
  out_of_service: 'Out of service',
  retired: 'Retired',
};

/** Most reefer units hold 4–6 kg; anything above this is a typo (grams, pounds) rather than a unit. */
export const MAX_CHARGE_KG = 50;
export const MIN_MANUFACTURE_YEAR = 1970;
export const MAX_MANUFACTURE_YEAR = 2100;
export const MAX_MONEY = 9_999_999_999.99;
export const MAX_NOTES_LENGTH = 2000;
export const MAX_SERIAL_LENGTH = 40;
export const MAX_MODEL_LENGTH = 60;
export const MAX_UNIT_PAGE_SIZE = 100;
export const MAX_LABELS_PER_SHEET_REQUEST = 500;

/** A cleared form field or an empty CSV cell means "not given". */
const blankToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v);
/** Form fields and CSV cells arrive as text; a decimal comma is accepted ("4,5" kg). */
const toNumber = (v: unknown) => {
  const b = blankToNull(v);
  return typeof b === 'string' ? Number(b.trim().replace(/^(-?\d+),(\d+)$/, '$1.$2')) : b;
};

export const containerNumberSchema = z.string({ error: 'Enter the container number' }).transform((v, ctx) => {
  const r = parseContainerNumber(v);
  if (!r.ok) {
    ctx.addIssue({ code: 'custom', message: r.error });
    return z.NEVER;
  }
  return r.value;
});

export const refrigerantSchema = z.string({ error: 'Choose the refrigerant' }).transform((v, ctx) => {
  const r = findRefrigerant(v);
  if (!r) {
    ctx.addIssue({
      code: 'custom',
      message: `Unknown refrigerant "${v}". Use one of ${REFRIGERANT_CODES.join(', ')}.`,
    });
    return z.NEVER;
  }
  return r.code;
});

const optionalText = (max: number) =>
  z.preprocess(
    (v) => (typeof v === 'string' ? (v.trim() === '' ? null : v.trim()) : v),
    z.string().max(max, `Use at most ${max} characters`).nullable(),
  );

const moneySchema = z.preprocess(
  toNumber,
  z
    .number({ error: 'Enter an amount, e.g. 12500.00' })
    .nonnegative('The amount cannot be negative')
    .max(MAX_MONEY, 'The amount is too large')
    // Stored as decimal(12,2).
    .transform((v) => Math.round(v * 100) / 100)
    .nullable(),
);

const statusSchema = z.preprocess(
  // "In service", "out-of-service" and the like from spreadsheets.
  (v) =>
    typeof v === 'string'
      ? v
          .trim()
          .toLowerCase()
          .replace(/[\s-]+/g, '_')
      : v,
  z.enum(UNIT_STATUSES, { message: 'Use in_service, out_of_service or retired' }),
);

const unitFields = {
  containerNumber: containerNumberSchema,
  refrigerant: refrigerantSchema,
  nominalChargeKg: z.preprocess(
    toNumber,
    z
      .number({ error: 'Enter the full charge in kg' })
      .positive('The charge must be more than 0 kg')
      .max(MAX_CHARGE_KG, `A unit holds at most ${MAX_CHARGE_KG} kg; check the unit (kg, not g or lb)`),
  ),
  commissionedOn: z.preprocess(
    blankToNull,
    daySchema({ format: 'Use a date like 2024-05-31', earliest: EARLIEST_RECORD_DAY, latest: 'today' }).nullable(),
  ),
  siteId: z.preprocess(toNumber, z.number({ error: 'Choose a site' }).int().positive().nullable()),
  status: statusSchema,
  machinerySerial: optionalText(MAX_SERIAL_LENGTH),
  model: optionalText(MAX_MODEL_LENGTH),
  manufactureYear: z.preprocess(
    toNumber,
    z
      .number({ error: 'Enter a year, e.g. 2019' })
      .int('Enter a whole year')
      .min(MIN_MANUFACTURE_YEAR, `Use a year from ${MIN_MANUFACTURE_YEAR}`)
      .max(MAX_MANUFACTURE_YEAR, `Use a year up to ${MAX_MANUFACTURE_YEAR}`)
      .nullable(),
  ),
  purchaseCost: moneySchema,
  residualValue: moneySchema,
  notes: optionalText(MAX_NOTES_LENGTH),
};

export const createUnitSchema = z.object({
  containerNumber: unitFields.containerNumber,
  refrigerant: unitFields.refrigerant,
  nominalChargeKg: unitFields.nominalChargeKg,
  commissionedOn: unitFields.commissionedOn.optional(),
  siteId: unitFields.siteId.optional(),
  status: unitFields.status.optional(),
  machinerySerial: unitFields.machinerySerial.optional(),
  model: unitFields.model.optional(),
  manufactureYear: unitFields.manufactureYear.optional(),
  purchaseCost: unitFields.purchaseCost.optional(),
  residualValue: unitFields.residualValue.optional(),
  notes: unitFields.notes.optional(),
});
export type CreateUnitInput = z.output<typeof createUnitSchema>;

export const updateUnitSchema = z
  .object({
    containerNumber: unitFields.containerNumber.optional(),
    refrigerant: unitFields.refrigerant.optional(),
    nominalChargeKg: unitFields.nominalChargeKg.optional(),
    commissionedOn: unitFields.commissionedOn.optional(),
    siteId: unitFields.siteId.optional(),
    status: unitFields.status.optional(),
    machinerySerial: unitFields.machinerySerial.optional(),
    model: unitFields.model.optional(),
    manufactureYear: unitFields.manufactureYear.optional(),
    purchaseCost: unitFields.purchaseCost.optional(),
    residualValue: unitFields.residualValue.optional(),
    notes: unitFields.notes.optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), { message: 'Nothing to change' });
export type UpdateUnitInput = z.output<typeof updateUnitSchema>;

/** The fields a unit edit records in its change history, with the words the history shows. */
export const UNIT_FIELD_LABELS = {
  containerNumber: 'Container number',
  refrigerant: 'Refrigerant',
  nominalChargeKg: 'Full charge (kg)',
  commissionedOn: 'Commissioned on',
  site: 'Site',
  status: 'Status',
  machinerySerial: 'Machinery serial',
  model: 'Model',
  manufactureYear: 'Year of manufacture',
  purchaseCost: 'Purchase cost',
  residualValue: 'Residual value',
  notes: 'Notes',
  qrIssuedAt: 'QR label issued',
  registered: 'Registered',
} as const;
export type UnitField = keyof typeof UNIT_FIELD_LABELS;

export const UNIT_SORTS = ['containerNumber', 'updatedAt', 'commissionedOn', 'nominalChargeKg'] as const;
export type UnitSort = (typeof UNIT_SORTS)[number];

export const unitListQuerySchema = z.object({
  // A prefix of the container number, typed loosely ("hrlu 12").
  q: z
    .string()
    .max(20, 'Type at most 11 characters')
    .transform(normalizeContainerNumber)
    .pipe(z.string().regex(/^[A-Z0-9]*$/, 'Search by container number: letters and digits only'))
    .optional(),
  siteId: z.coerce.number().int().positive().optional(),
  status: z.enum(UNIT_STATUSES).optional(),
  refrigerant: refrigerantSchema.optional(),
  sort: z.enum(UNIT_SORTS).default('containerNumber'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  page: z.coerce.number().int().min(1).max(1_000_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(MAX_UNIT_PAGE_SIZE).default(25),
});
export type UnitListQuery = z.output<typeof unitListQuerySchema>;
export type UnitListFilters = z.input<typeof unitListQuerySchema>;

export const unitIdParamSchema = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) });
export const qrTokenParamSchema = z.object({
  token: z.string().regex(/^[A-Za-z0-9_-]{16,64}$/, 'This is not a Tightloop label code'),
});
export const containerNumberParamSchema = z.object({ number: z.string().min(1).max(40) });

export const labelsRequestSchema = z.object({
  unitIds: z
    .array(z.number().int().positive())
    .min(1, 'Choose at least one unit')
    .max(MAX_LABELS_PER_SHEET_REQUEST, `Print at most ${MAX_LABELS_PER_SHEET_REQUEST} labels at a time`),
});
export type LabelsRequest = z.infer<typeof labelsRequestSchema>;

export const unitSiteDto = z.object({ id: z.number(), code: z.string(), name: z.string(), kind: z.enum(SITE_KINDS) });

export const unitDto = z.object({
  id: z.number(),
  containerNumber: z.string(),
  refrigerant: z.string(),
  nominalChargeKg: z.number(),
  commissionedOn: z.string().nullable(),
  status: z.enum(UNIT_STATUSES),
  site: unitSiteDto.nullable(),
  machinerySerial: z.string().nullable(),
  model: z.string().nullable(),
  manufactureYear: z.number().nullable(),
  purchaseCost: z.number().nullable(),
  residualValue: z.number().nullable(),
  notes: z.string().nullable(),
  qrIssuedAt: z.string(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type UnitDto = z.infer<typeof unitDto>;

export const unitResponseDto = z.object({ unit: unitDto });
export type UnitResponseDto = z.infer<typeof unitResponseDto>;

export const unitListDto = z.object({
  units: z.array(unitDto),
  total: z.number(),
  page: z.number(),
  pageSize: z.number(),
});
export type UnitListDto = z.infer<typeof unitListDto>;

export const unitChangeDto = z.object({
  id: z.number(),
  at: z.string(),
  field: z.string(),
  label: z.string(),
  before: z.string().nullable(),
  after: z.string().nullable(),
  user: z.object({ id: z.string(), name: z.string() }),
});
export type UnitChangeDto = z.infer<typeof unitChangeDto>;
export const unitChangesDto = z.object({ changes: z.array(unitChangeDto) });
export type UnitChangesDto = z.infer<typeof unitChangesDto>;

// ---- Fleet import (CSV) ----

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
  machinerySerial: unitFields.machinerySerial.optional(),
  model: unitFields.model.optional(),
  manufactureYear: unitFields.manufactureYear.optional(),
  purchaseCost: unitFields.purchaseCost.optional(),
  residualValue: unitFields.residualValue.optional(),
  notes: unitFields.notes.optional(),
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
