import { z } from 'zod';
import { findRefrigerant, normalizeContainerNumber, parseContainerNumber, REFRIGERANT_CODES } from '../domain';
import { blankToNull, daySchema, EARLIEST_RECORD_DAY, optionalText, textToId, textToNumber } from './common';
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

/** A refrigerant by any usual spelling (r134a, R-134A), as its code. */
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

export const containerNumberSchema = z.string({ error: 'Enter the container number' }).transform((v, ctx) => {
  const r = parseContainerNumber(v);
  if (!r.ok) {
    ctx.addIssue({ code: 'custom', message: r.error });
    return z.NEVER;
  }
  return r.value;
});

const moneySchema = z.preprocess(
  textToNumber,
  z
    .number({ error: 'Enter an amount, e.g. 12500.00' })
    .nonnegative('The amount cannot be negative')
    .max(MAX_MONEY, 'The amount is too large')
    // Stored as decimal(12,2).
    .transform((v) => Math.round(v * 100) / 100)
    .nullable(),
);

export const statusSchema = z.preprocess(
  textToId,
  z.enum(UNIT_STATUSES, { message: 'Use in_service, out_of_service or retired' }),
);

export const unitFields = {
  containerNumber: containerNumberSchema,
  refrigerant: refrigerantSchema,
  nominalChargeKg: z.preprocess(
    textToNumber,
    z
      .number({ error: 'Enter the full charge in kg' })
      .positive('The charge must be more than 0 kg')
      .max(MAX_CHARGE_KG, `A unit holds at most ${MAX_CHARGE_KG} kg; check the unit (kg, not g or lb)`),
  ),
  commissionedOn: z.preprocess(
    blankToNull,
    daySchema({ format: 'Use a date like 2024-05-31', earliest: EARLIEST_RECORD_DAY, latest: 'today' }).nullable(),
  ),
  siteId: z.preprocess(textToNumber, z.number({ error: 'Choose a site' }).int().positive().nullable()),
  status: statusSchema,
  machinerySerial: optionalText(MAX_SERIAL_LENGTH),
  model: optionalText(MAX_MODEL_LENGTH),
  manufactureYear: z.preprocess(
    textToNumber,
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

/** A unit's own fields, in the order the form shows them. */
export const UNIT_INPUT_FIELDS = Object.keys(unitFields) as (keyof typeof unitFields)[];

/** The unit's details a form or a CSV row may leave out (left out: not given, or on an edit unchanged). */
export const unitDetailFields = {
  machinerySerial: unitFields.machinerySerial.optional(),
  model: unitFields.model.optional(),
  manufactureYear: unitFields.manufactureYear.optional(),
  purchaseCost: unitFields.purchaseCost.optional(),
  residualValue: unitFields.residualValue.optional(),
  notes: unitFields.notes.optional(),
};
const optionalUnitFields = {
  commissionedOn: unitFields.commissionedOn.optional(),
  siteId: unitFields.siteId.optional(),
  status: unitFields.status.optional(),
  ...unitDetailFields,
};

export const createUnitSchema = z.object({
  containerNumber: unitFields.containerNumber,
  refrigerant: unitFields.refrigerant,
  nominalChargeKg: unitFields.nominalChargeKg,
  ...optionalUnitFields,
});
export type CreateUnitInput = z.output<typeof createUnitSchema>;

export const updateUnitSchema = z
  .object({
    containerNumber: unitFields.containerNumber.optional(),
    refrigerant: unitFields.refrigerant.optional(),
    nominalChargeKg: unitFields.nominalChargeKg.optional(),
    ...optionalUnitFields,
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
export const containerNumberParamSchema = z.object({ number: z.string().min(1).max(40) });

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
