import { z } from 'zod';
import type { Permission } from '../permissions';
import { jobDto } from './jobs';
import { LEAK_LOCATION_IDS } from '../domain/service-terms';

/** Highest PTI validity an owner may set, in days. */
export const MAX_PTI_VALIDITY_DAYS = 365;
export const MIN_PTI_VALIDITY_DAYS = 30;

const money = (value: number) => z.number().nonnegative().default(value);
const days = (value: number) => z.number().int().positive().max(3650).default(value);

const leakCheckBandSchema = z.object({
  fromTCO2e: z.number().nonnegative(),
  months: z.number().int().positive().max(120),
});

/** Charge bands of a custom leak-check policy; the EU bands are the default (Reg. (EU) 2024/573). */
const customLeakCheckSchema = z
  .object({
    bands: z
      .array(leakCheckBandSchema)
      .min(1)
      .default([
        { fromTCO2e: 5, months: 12 },
        { fromTCO2e: 50, months: 6 },
        { fromTCO2e: 500, months: 3 },
      ]),
  })
  .refine((v) => v.bands.every((b, i) => i === 0 || b.fromTCO2e > v.bands[i - 1].fromTCO2e), {
    message: 'Leak-check bands must be listed from the smallest charge up, each starting above the previous one.',
    path: ['bands'],
  });

const scoreSchema = z
  .object({
    // DOMAIN.md §6 weights; they must add up to 1.
    weights: z
      .object({
        rate: z.number().min(0).max(1).default(0.4),
        count: z.number().min(0).max(1).default(0.25),
        afterRepair: z.number().min(0).max(1).default(0.2),
        sameSpot: z.number().min(0).max(1).default(0.15),
      })
      .prefault({})
      .refine((w) => Math.abs(w.rate + w.count + w.afterRepair + w.sameSpot - 1) < 1e-6, {
        message: 'The four score weights must add up to 1.',
      }),
    /** Rolling leak rate (%) at which the rate factor is full. */
    rateCapPct: z.number().positive().max(1000).default(50),
    /** Band edges: below watchFrom "tight", below chronicFrom "watch", else "chronic". */
    watchFrom: z.number().min(0).max(100).default(30),
    chronicFrom: z.number().min(0).max(100).default(60),
  })
  .refine((s) => s.watchFrom < s.chronicFrom, {
    message: 'The "watch" band must start below the "chronic" band.',
    path: ['chronicFrom'],
  });

const windowsSchema = z
  .object({
    /** Trailing window of the rolling rate and of the score's count and recurrence factors. */
    rollingDays: days(365),
    /** A recurrence this soon after a repair scores in full; later, up to rollingDays, half. */
    afterRepairDays: days(180),
    /** Window in which a leak at the same location twice scores. */
    sameSpotDays: days(730),
    /** A repair "held" when nothing was added and no leak found for this long (fleet analytics). */
    repairHoldDays: days(180),
  })
  .refine((w) => w.afterRepairDays <= w.rollingDays, {
    message: 'The after-repair window cannot be longer than the rolling window.',
    path: ['afterRepairDays'],
  });

const pressureSchema = z.object({
  /** Snapshots this many days after a recharge or verified repair form the approach baseline. */
  baselineWindowDays: days(30),
  /** Drift (K) at or below which the unit is flagged "possible low charge" (common practice). */
  driftFlagK: z.number().max(0).min(-50).default(-3),
});

const refrigerantPriceSchema = z.object({
  'R-134a': money(30), // Invented demo default
  'R-404A': money(45), // Invented demo default
  'R-452A': money(60), // Invented demo default
  'R-513A': money(55), // Invented demo default
  'R-1234yf': money(90), // Invented demo default
  'R-744': money(5), // Invented demo default
});

const repairCostSchema = z.object({
  service_valve: money(180), // Invented demo default
  brazed_joint: money(350), // Invented demo default
  condenser_coil: money(1400), // Invented demo default
  evaporator_coil: money(1800), // Invented demo default
  compressor: money(2600), // Invented demo default
  filter_drier: money(220), // Invented demo default
  sight_glass: money(200), // Invented demo default
  receiver: money(650), // Invented demo default
  expansion_valve: money(480), // Invented demo default
  pressure_switch: money(260), // Invented demo default
  other: money(400), // Invented demo default
} satisfies Record<(typeof LEAK_LOCATION_IDS)[number], z.ZodType>);

const economicsSchema = z.object({
  currency: z
    .string()
    .regex(/^[A-Z]{3}$/, 'Use a 3-letter currency code such as USD.')
    .default('USD'),
  discountRatePct: z.number().min(0).max(100).default(8),
  /** Source: UNEP/COA 2012, 12–15 years. */
  designLifeYears: z.number().int().min(1).max(50).default(15),
  /** Source: COA 2012, approximate. */
  newUnitCost: money(17000),
  /** Source: COA 2012, approximate. */
  machineryCost: money(8000),
  /** Source: a lessor's public filing, approximate, at 12 years. */
  residualValue: money(3000),
  refrigerantPricePerKg: refrigerantPriceSchema.prefault({}),
  labourPerVisit: money(120), // Invented demo default
  downtimePerVisit: money(150), // Invented demo default
  repairCostByLocation: repairCostSchema.prefault({}),
  /** Share of repairs expected to leak again when the fleet has too few repairs at that location (DOMAIN.md §9). */
  defaultRecurrence: z.number().min(0).max(1).default(0.3),
  minRepairsForRate: z.number().int().min(1).max(1000).default(5),
});

const forecastSchema = z.object({
  /** K: the most similar past cases the next top-up forecast learns from (DOMAIN.md §7b; our definition, 100). */
  neighbours: z.number().int().min(10).max(1000).default(100),
});

const rechecksSchema = z.object({
  /** Days after a top-up without a found and repaired leak (common practice, no published source: the next day). */
  afterTopUpDays: z.number().int().min(0).max(60).default(1),
  /** Days after a repair; Source: Regulation (EU) 2024/573, a re-check within one month of a repair. */
  afterRepairDays: z.number().int().min(1).max(60).default(30),
});

const cylindersSchema = z.object({
  /** kg the visits may differ from a cylinder's weighed loss before it is flagged (our own default, 0.5 kg). */
  toleranceKg: z.number().min(0).max(50).default(0.5),
  /** A recovery cylinder warns from this share of its maker's marked maximum (our own default, 90 %). */
  nearFullPct: z.number().min(50).max(100).default(90),
});

export const settingsSchema = z.object({
  /** EU: Reg. (EU) 2024/573 intervals (default); US: 40 CFR 82 reference thresholds; custom: the bands below. */
  policy: z.enum(['EU', 'US', 'custom']).default('EU'),
  customLeakCheck: customLeakCheckSchema.prefault({}),
  /** AR4 is the EU legal basis. */
  gwpBasis: z.enum(['AR4', 'AR5']).default('AR4'),
  score: scoreSchema.prefault({}),
  windows: windowsSchema.prefault({}),
  /** Rolling leak rate (%) that triggers an alert; 20 % is the US commercial-refrigeration threshold, 40 CFR 82.157(c)(2). */
  leakRateThresholdPct: z.number().positive().max(1000).default(20),
  ptiValidityDays: z.number().int().min(MIN_PTI_VALIDITY_DAYS).max(MAX_PTI_VALIDITY_DAYS).default(90),
  pressure: pressureSchema.prefault({}),
  economics: economicsSchema.prefault({}),
  forecast: forecastSchema.prefault({}),
  rechecks: rechecksSchema.prefault({}),
  cylinders: cylindersSchema.prefault({}),
});

export type Settings = z.infer<typeof settingsSchema>;
export type SettingsInput = z.input<typeof settingsSchema>;

export const DEFAULT_SETTINGS: Settings = settingsSchema.parse({});

// ---- The settings over the API ----

export const SETTINGS_SECTIONS = ['policy', 'thresholds', 'pti', 'economics'] as const;
export type SettingsSection = (typeof SETTINGS_SECTIONS)[number];

/** The top-level settings keys each section of the page holds. */
export const SETTINGS_SECTION_KEYS = {
  policy: ['policy', 'customLeakCheck', 'gwpBasis'],
  thresholds: ['score', 'windows', 'leakRateThresholdPct', 'pressure', 'forecast', 'cylinders'],
  pti: ['ptiValidityDays', 'rechecks'],
  economics: ['economics'],
} as const satisfies Record<SettingsSection, readonly (keyof Settings)[]>;

export const SETTINGS_SECTION_LABELS: Record<SettingsSection, string> = {
  policy: 'Leak-check policy',
  thresholds: 'Thresholds and score',
  pti: 'PTI validity',
  economics: 'Prices and economics',
};

/** Policy, thresholds, score weights and PTI validity are the administrator's; prices are the owner's too. */
export const SETTINGS_SECTION_PERMISSION: Record<SettingsSection, Permission> = {
  policy: 'manage:settings',
  thresholds: 'manage:settings',
  pti: 'manage:settings',
  economics: 'manage:costs',
};

/** Sections whose change alters every unit's statistics (prices do not). */
export const RECOMPUTING_SECTIONS: readonly SettingsSection[] = ['policy', 'thresholds', 'pti'];

export const updateSettingsSchema = z.object({
  settings: settingsSchema,
  /** The version the change was made on; a newer one in between is a conflict. null = the defaults. */
  baseVersion: z.number().int().nonnegative().nullable(),
});
export type UpdateSettingsInput = z.infer<typeof updateSettingsSchema>;
export type UpdateSettingsBody = z.input<typeof updateSettingsSchema>;

/** Sections a role may not even read: prices are the owners' (ASVS 4.0 4.1.3, least privilege). */
export const SETTINGS_SECTION_READ_PERMISSION: Partial<Record<SettingsSection, Permission>> = {
  economics: 'manage:costs',
};

/** The settings as a reader sees them: a section they may not read is left out. */
export type VisibleSettings = Omit<Settings, 'economics'> & Partial<Pick<Settings, 'economics'>>;

export const settingsDto = z.object({
  settings: z.custom<VisibleSettings>(),
  /** Sections left out for this reader's role. */
  hiddenSections: z.array(z.enum(SETTINGS_SECTIONS)),
  /** 0 while the defaults are in force. */
  version: z.number(),
  updatedAt: z.string().nullable(),
  updatedBy: z.object({ id: z.string(), name: z.string() }).nullable(),
  /** The latest statistics recompute, running or finished. */
  recompute: jobDto.nullable(),
});
export type SettingsDto = z.infer<typeof settingsDto>;

/** After a save: the settings as read back, and which sections the save changed. */
export const savedSettingsDto = settingsDto.extend({ changedSections: z.array(z.enum(SETTINGS_SECTIONS)) });
export type SavedSettingsDto = z.infer<typeof savedSettingsDto>;

export const settingsHistoryDto = z.object({
  versions: z.array(
    z.object({
      version: z.number(),
      updatedAt: z.string(),
      updatedBy: z.object({ id: z.string(), name: z.string() }),
      sections: z.array(z.enum(SETTINGS_SECTIONS)),
    }),
  ),
});
export type SettingsHistoryDto = z.infer<typeof settingsHistoryDto>;

/** Which sections differ between two settings objects. */
export function changedSections(before: Settings, after: Settings): SettingsSection[] {
  return SETTINGS_SECTIONS.filter((s) =>
    SETTINGS_SECTION_KEYS[s].some((k) => JSON.stringify(before[k]) !== JSON.stringify(after[k])),
  );
}
