// Reading and changing the settings: sections, who may change which, and the recompute job that follows.
import { z } from 'zod';
import type { Permission } from '../permissions';
import { settingsSchema, type Settings } from './settings';

export const SETTINGS_SECTIONS = ['policy', 'thresholds', 'pti', 'economics'] as const;
export type SettingsSection = (typeof SETTINGS_SECTIONS)[number];

/** The top-level settings keys each section of the page holds. */
export const SETTINGS_SECTION_KEYS = {
  policy: ['policy', 'customLeakCheck', 'gwpBasis'],
  thresholds: ['score', 'windows', 'leakRateThresholdPct', 'pressure', 'forecast'],
  pti: ['ptiValidityDays'],
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

export type JobDto = {
  id: number;
  kind: 'stats_recompute' | 'repair_effectiveness' | 'forecast_cases';
  status: 'running' | 'done' | 'failed' | 'superseded';
  total: number;
  processed: number;
  message: string | null;
  startedAt: string;
  finishedAt: string | null;
};

/** Sections a role may not even read: prices are the owners' (ASVS 4.0 4.1.3, least privilege). */
export const SETTINGS_SECTION_READ_PERMISSION: Partial<Record<SettingsSection, Permission>> = {
  economics: 'manage:costs',
};

/** The settings as a reader sees them: a section they may not read is left out. */
export type VisibleSettings = Omit<Settings, 'economics'> & Partial<Pick<Settings, 'economics'>>;

export type SettingsDto = {
  settings: VisibleSettings;
  /** Sections left out for this reader's role. */
  hiddenSections: SettingsSection[];
  /** 0 while the defaults are in force. */
  version: number;
  updatedAt: string | null;
  updatedBy: { id: string; name: string } | null;
  /** The latest statistics recompute, running or finished. */
  recompute: JobDto | null;
};

export type SettingsHistoryDto = {
  versions: {
    version: number;
    updatedAt: string;
    updatedBy: { id: string; name: string };
    sections: SettingsSection[];
  }[];
};

/** Which sections differ between two settings objects. */
export function changedSections(before: Settings, after: Settings): SettingsSection[] {
  return SETTINGS_SECTIONS.filter((s) =>
    SETTINGS_SECTION_KEYS[s].some((k) => JSON.stringify(before[k]) !== JSON.stringify(after[k])),
  );
}
