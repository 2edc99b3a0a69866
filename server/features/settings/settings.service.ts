// Reading the settings as a viewer may see them, their change history, and saving a new version.
import { desc, eq } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { settingsVersions, users } from '../../db/schema';
import { conflict, forbidden } from '../../lib/http-error';
import type { SessionUser } from '../../lib/session';
import { parseStoredSettings, readCurrentSettings, type SettingsCache } from '../../lib/settings';
import { can } from '../../../shared/permissions';
import {
  DEFAULT_SETTINGS,
  changedSections,
  RECOMPUTING_SECTIONS,
  SETTINGS_SECTION_LABELS,
  SETTINGS_SECTION_KEYS,
  SETTINGS_SECTION_PERMISSION,
  SETTINGS_SECTION_READ_PERMISSION,
  SETTINGS_SECTIONS,
  type SettingsDto,
  type SettingsHistoryDto,
  type SettingsSection,
  type UpdateSettingsInput,
} from '../../../shared/schemas/settings';

/** The settings in force as `viewer` may read them (sections their role may not read are left out). */
export async function getSettingsDto(
  db: Db,
  recompute: SettingsDto['recompute'],
  viewer: SessionUser,
): Promise<SettingsDto> {
  const c = await readCurrentSettings(db);
  const hiddenSections = SETTINGS_SECTIONS.filter((s) => {
    const needs = SETTINGS_SECTION_READ_PERMISSION[s];
    return needs !== undefined && !can(viewer, needs);
  });
  const settings: Record<string, unknown> = { ...c.settings };
  for (const s of hiddenSections) for (const k of SETTINGS_SECTION_KEYS[s]) delete settings[k];
  let updatedBy: SettingsDto['updatedBy'] = null;
  if (c.updatedBy) {
    const [u] = await db.select({ id: users.id, name: users.name }).from(users).where(eq(users.id, c.updatedBy));
    updatedBy = u ?? null;
  }
  return {
    settings: settings as SettingsDto['settings'],
    hiddenSections,
    version: c.version,
    updatedAt: c.updatedAt?.toISOString() ?? null,
    updatedBy,
    recompute,
  };
}

export async function getSettingsHistory(db: Db, limit = 50): Promise<SettingsHistoryDto> {
  const rows = await db
    .select({
      id: settingsVersions.id,
      updatedAt: settingsVersions.updatedAt,
      sections: settingsVersions.changedSections,
      userId: users.id,
      userName: users.name,
    })
    .from(settingsVersions)
    .innerJoin(users, eq(users.id, settingsVersions.updatedBy))
    .orderBy(desc(settingsVersions.id))
    .limit(limit);
  return {
    versions: rows.map((r) => ({
      version: r.id,
      updatedAt: r.updatedAt.toISOString(),
      updatedBy: { id: r.userId, name: r.userName },
      sections: (r.sections ?? []) as SettingsSection[],
    })),
  };
}

/**
 * Saves a new version when something changed. Each changed section needs its own permission; a version saved by
 * someone else since `baseVersion` is a conflict. Returns whether unit statistics must be recomputed.
 */
export async function saveSettings(
  db: Db,
  cache: SettingsCache,
  user: SessionUser,
  input: UpdateSettingsInput,
  now: Date,
): Promise<{ version: number; sections: SettingsSection[]; recompute: boolean }> {
  const result = await db.transaction(async (tx) => {
    // Serialise saves: the newest row, locked, is the base every concurrent save compares against.
    const [latest] = await tx.select().from(settingsVersions).orderBy(desc(settingsVersions.id)).limit(1).for('update');
    const base = latest ? parseStoredSettings(latest.data) : DEFAULT_SETTINGS;
    const baseVersion = latest?.id ?? 0;
    if ((input.baseVersion ?? 0) !== baseVersion) {
      throw conflict(
        'Someone else changed the settings since you opened them. Reload to see their change, then apply yours.',
      );
    }
    const sections = changedSections(base, input.settings);
    const refused = sections.filter((s) => !can(user, SETTINGS_SECTION_PERMISSION[s]));
    if (refused.length) {
      throw forbidden(
        `Your role cannot change ${refused.map((s) => SETTINGS_SECTION_LABELS[s].toLowerCase()).join(' or ')}.`,
      );
    }
    if (!sections.length) return { version: baseVersion, sections, recompute: false };
    const [row] = await tx
      .insert(settingsVersions)
      .values({
        data: input.settings as unknown as Record<string, unknown>,
        changedSections: sections,
        updatedBy: user.id,
        updatedAt: now,
      })
      .$returningId();
    return { version: row.id, sections, recompute: sections.some((s) => RECOMPUTING_SECTIONS.includes(s)) };
  });
  cache.invalidate();
  return result;
}
