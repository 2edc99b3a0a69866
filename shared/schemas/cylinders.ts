// The cylinder register: refrigerant and recovery cylinders, their weighings, and what visits moved through them.
// One set of field rules serves the API and the CSV import, so a row the import accepts is one the form accepts.
import { z } from 'zod';
import { blankToNull, momentSchema, optionalText, textToId, textToNumber } from './common';
import { refrigerantSchema } from './units';
import { DEFAULT_SETTINGS, type Settings } from './settings';
import type { CylinderLedger } from '../domain/cylinders';

export const CYLINDER_KINDS = ['new', 'recovery'] as const;
export type CylinderKind = (typeof CYLINDER_KINDS)[number];
export const CYLINDER_STATUSES = ['full', 'in_use', 'empty', 'sent_for_reclaim', 'quarantined'] as const;
export type CylinderStatus = (typeof CYLINDER_STATUSES)[number];
/** What the EU log asks of the gas put into a system (Reg. (EU) No 517/2014 Art. 6). */
export const GAS_ORIGINS = ['virgin', 'recycled', 'reclaimed'] as const;
export type GasOrigin = (typeof GAS_ORIGINS)[number];

export const CYLINDER_KIND_LABELS: Record<CylinderKind, string> = {
  new: 'Refrigerant supply',
  recovery: 'Recovery',
};
export const CYLINDER_STATUS_LABELS: Record<CylinderStatus, string> = {
  full: 'Full',
  in_use: 'In use',
  empty: 'Empty',
  sent_for_reclaim: 'Sent for reclaim',
  quarantined: 'Quarantined',
};
export const GAS_ORIGIN_LABELS: Record<GasOrigin, string> = {
  virgin: 'Virgin',
  recycled: 'Recycled',
  reclaimed: 'Reclaimed',
};

export const MAX_CYLINDER_CODE_LENGTH = 24;
export const MAX_CYLINDER_TEXT = 80;
export const MAX_CYLINDER_KG = 1000;
export const MAX_CYLINDER_IMPORT_ROWS = 5000;
export const MAX_CYLINDER_IMPORT_BYTES = 2 * 1024 * 1024;
export const MAX_REGISTER_PAGE = 500;

const kgField = (what: string, min: number) =>
  z.preprocess(
    textToNumber,
    z
      .number({ error: `Enter the ${what} in kg` })
      .min(min, `The ${what} must be at least ${min} kg`)
      .max(MAX_CYLINDER_KG, `A cylinder's ${what} above ${MAX_CYLINDER_KG} kg is not plausible; check the unit (kg)`),
  );

export const cylinderCodeSchema = z
  .string({ error: 'Enter the cylinder number' })
  .trim()
  .toUpperCase()
  .min(3, 'A cylinder number has at least 3 characters')
  .max(MAX_CYLINDER_CODE_LENGTH, `A cylinder number has at most ${MAX_CYLINDER_CODE_LENGTH} characters`)
  .regex(/^[A-Z0-9][A-Z0-9./-]*$/, 'Use letters, digits, dots, slashes and hyphens');

const cylinderFields = z.object({
  code: z.preprocess(blankToNull, cylinderCodeSchema.nullable().optional()),
  kind: z.preprocess(
    (v) => {
      const w = textToId(v);
      return w === 'supply' || w === 'refrigerant' || w === 'virgin' ? 'new' : w;
    },
    z.enum(CYLINDER_KINDS, { message: 'Use new (refrigerant supply) or recovery' }),
  ),
  refrigerant: refrigerantSchema,
  tareKg: kgField('tare', 0.5),
  /** The cylinder maker's marked maximum fill, in kg of refrigerant. */
  capacityKg: kgField('maximum fill', 0.5),
  supplier: optionalText(MAX_CYLINDER_TEXT).optional(),
  lot: optionalText(64).optional(),
  gasOrigin: z.preprocess(
    (v) => (blankToNull(v) === null ? null : textToId(v)),
    z.enum(GAS_ORIGINS, { message: 'Use virgin, recycled or reclaimed' }).nullable().optional(),
  ),
  status: z.preprocess(
    (v) => (blankToNull(v) === null ? undefined : textToId(v)),
    z.enum(CYLINDER_STATUSES, { message: `Use ${CYLINDER_STATUSES.join(', ')}` }).optional(),
  ),
  /** A first weighing taken when the cylinder is registered. */
  grossKg: z.preprocess(textToNumber, kgField('gross weight', 0.5).nullable().optional()),
  notes: optionalText(500).optional(),
});

type FieldsOut = z.output<typeof cylinderFields>;
type Ctx = z.RefinementCtx;
/** Rules across fields, the same for the form and the CSV import. */
function crossCheck(c: FieldsOut, ctx: Ctx) {
  if (c.kind === 'new' && !c.gasOrigin) {
    ctx.addIssue({
      code: 'custom',
      message: 'Say whether the gas is virgin, recycled or reclaimed',
      path: ['gasOrigin'],
    });
  }
  if (c.grossKg != null && c.grossKg < c.tareKg) {
    ctx.addIssue({ code: 'custom', message: 'The gross weight is below the tare weight', path: ['grossKg'] });
  }
  if (c.grossKg != null && c.grossKg - c.tareKg > c.capacityKg + 0.001) {
    ctx.addIssue({
      code: 'custom',
      message: "The weight says it holds more than the maker's marked maximum fill",
      path: ['grossKg'],
    });
  }
  if (c.status === 'quarantined') {
    ctx.addIssue({
      code: 'custom',
      message: 'Register the cylinder first, then quarantine it with a reason',
      path: ['status'],
    });
  }
}

export const createCylinderSchema = cylinderFields
  .extend({ siteId: z.preprocess(textToNumber, z.number().int().positive().nullable().optional()) })
  .superRefine(crossCheck);
export type CreateCylinderInput = z.output<typeof createCylinderSchema>;

export const cylinderImportRowSchema = cylinderFields
  .extend({
    siteCode: z.preprocess(
      (v) => (typeof v === 'string' ? (v.trim() === '' ? null : v.trim().toUpperCase()) : v),
      z.string().max(16, 'A site code has at most 16 characters').nullable().optional(),
    ),
  })
  .superRefine(crossCheck);
export type CylinderImportRow = z.output<typeof cylinderImportRowSchema>;

/** The import's columns, in the template's order. */
export const CYLINDER_IMPORT_COLUMNS = [
  'code',
  'kind',
  'refrigerant',
  'tareKg',
  'capacityKg',
  'grossKg',
  'gasOrigin',
  'supplier',
  'lot',
  'siteCode',
  'status',
  'notes',
] as const;

export const cylinderStatusChangeSchema = z
  .object({
    status: z.enum(CYLINDER_STATUSES, { message: 'Choose a status' }),
    reason: z.string().trim().max(500).optional(),
    siteId: z.number().int().positive().nullable().optional(),
  })
  .refine((c) => c.status !== 'quarantined' || (c.reason && c.reason.length >= 3), {
    message: 'Say why the cylinder is quarantined',
    path: ['reason'],
  });
export type CylinderStatusChangeInput = z.infer<typeof cylinderStatusChangeSchema>;

export const weighingSchema = z.object({
  grossKg: z
    .number({ error: 'Enter the gross weight in kg' })
    .min(0.5, 'The gross weight must be at least 0.5 kg')
    .max(2 * MAX_CYLINDER_KG, 'That weight is not plausible for a cylinder'),
  weighedAt: momentSchema({ format: 'Enter when it was weighed' }).optional(),
  note: z.string().trim().max(500).optional(),
});
export type WeighingInput = z.infer<typeof weighingSchema>;

export const cylinderListQuerySchema = z.object({
  siteId: z.coerce.number().int().positive().optional(),
  kind: z.enum(CYLINDER_KINDS).optional(),
  refrigerant: z.string().max(16).optional(),
  /** Only cylinders a visit can use now (not quarantined, not sent for reclaim). */
  usable: z
    .enum(['true', 'false'])
    .transform((v) => v === 'true')
    .optional(),
  q: z.string().trim().max(MAX_CYLINDER_CODE_LENGTH).optional(),
});
export type CylinderListQuery = z.output<typeof cylinderListQuerySchema>;

export const cylinderIdParamSchema = z.object({ id: z.coerce.number().int().positive() });
export const cylinderCodeParamSchema = z.object({ code: cylinderCodeSchema });

// --- responses ---------------------------------------------------------------------------------------------

const siteRef = z.object({ id: z.number(), name: z.string() });
const personRef = z.object({ id: z.string(), name: z.string() });

export const cylinderDto = z.object({
  id: z.number(),
  code: z.string(),
  kind: z.enum(CYLINDER_KINDS),
  refrigerant: z.string(),
  tareKg: z.number(),
  capacityKg: z.number(),
  supplier: z.string().nullable(),
  lot: z.string().nullable(),
  gasOrigin: z.enum(GAS_ORIGINS).nullable(),
  site: siteRef.nullable(),
  status: z.enum(CYLINDER_STATUSES),
  notes: z.string().nullable(),
  quarantine: z.object({ at: z.string(), reason: z.string(), by: z.string() }).nullable(),
  labelUrl: z.string(),
  createdAt: z.string(),
  ledger: z.custom<CylinderLedger>(),
});
export type CylinderDto = z.infer<typeof cylinderDto>;

export const weighingDto = z.object({
  id: z.number(),
  grossKg: z.number(),
  netKg: z.number(),
  weighedAt: z.string(),
  recordedBy: personRef,
  note: z.string().nullable(),
});
export type WeighingDto = z.infer<typeof weighingDto>;

export const cylinderMoveDto = z.object({
  eventId: z.number(),
  unitId: z.number(),
  containerNumber: z.string(),
  kind: z.string(),
  direction: z.enum(['in', 'out']),
  kg: z.number(),
  occurredAt: z.string(),
  site: siteRef.nullable(),
  technician: personRef,
  voided: z.boolean(),
});
export type CylinderMoveDto = z.infer<typeof cylinderMoveDto>;

export const cylinderDetailDto = z.object({
  cylinder: cylinderDto,
  weighings: z.array(weighingDto),
  moves: z.array(cylinderMoveDto),
  /** Units charged from this cylinder that carry its quarantine mark. */
  quarantinedUnits: z.array(z.object({ unitId: z.number(), containerNumber: z.string(), markedAt: z.string() })),
});
export type CylinderDetailDto = z.infer<typeof cylinderDetailDto>;

export const cylinderResponseDto = z.object({ cylinder: cylinderDto });
export type CylinderResponseDto = z.infer<typeof cylinderResponseDto>;

export const cylinderListDto = z.object({
  cylinders: z.array(cylinderDto),
  toleranceKg: z.number(),
  nearFullPct: z.number(),
});
export type CylinderListDto = z.infer<typeof cylinderListDto>;

export const cylinderImportResultDto = z.object({ imported: z.number(), cylinderIds: z.array(z.number()) });
export type CylinderImportResultDto = z.infer<typeof cylinderImportResultDto>;
export type CylinderImportRowError = { row: number; field: string | null; message: string };

export const quarantineResultDto = z.object({
  cylinder: cylinderDto,
  unitsMarked: z.number(),
  unitIds: z.array(z.number()),
});
export type QuarantineResultDto = z.infer<typeof quarantineResultDto>;

/** The register's settings (settings.cylinders: tolerance and the near-full warning). */
export type CylinderSettings = Settings['cylinders'];
export const DEFAULT_CYLINDER_SETTINGS: CylinderSettings = DEFAULT_SETTINGS.cylinders;
/** The register's settings from the settings in force (older stored versions carry none: the defaults). */
export function cylinderSettingsOf(settings: Pick<Settings, 'cylinders'> | object): CylinderSettings {
  const given = (settings as { cylinders?: Partial<CylinderSettings> }).cylinders;
  return { ...DEFAULT_CYLINDER_SETTINGS, ...given };
}
