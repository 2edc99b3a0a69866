// The settings in force: the newest row of `settings` (append-only versions), defaults until the first save. Every
// write reads them, so each app keeps the current version a few seconds (createSettingsCache, owned by the app
// context); the settings feature saves new versions and clears it.
import { desc, eq } from 'drizzle-orm';
import type { DbOrTx } from '../db/client';
import { settingsVersions } from '../db/schema';
import { DEFAULT_SETTINGS, settingsSchema, type Settings } from '../../shared/schemas/settings';

export type CurrentSettings = { settings: Settings; version: number; updatedAt: Date | null; updatedBy: string | null };

/** Parses a stored version; a row that no longer parses (schema grew a rule) falls back to the defaults per field. */
export function parseStoredSettings(data: unknown): Settings {
  const parsed = settingsSchema.safeParse(data);
  return parsed.success ? parsed.data : DEFAULT_SETTINGS;
}

/** The newest version, read now (no cache). */
export async function readCurrentSettings(db: DbOrTx): Promise<CurrentSettings> {
  const [row] = await db.select().from(settingsVersions).orderBy(desc(settingsVersions.id)).limit(1);
  if (!row) return { settings: DEFAULT_SETTINGS, version: 0, updatedAt: null, updatedBy: null };
  return {
    settings: parseStoredSettings(row.data),
    version: row.id,
    updatedAt: row.updatedAt,
    updatedBy: row.updatedBy,
  };
}

/** The settings in force, read now (scripts and the demo fleet; the API reads them through its cache). */
export async function getSettings(db: DbOrTx): Promise<Settings> {
  return (await readCurrentSettings(db)).settings;
}

/** One saved version (a recompute job applies the version it was started for); the one in force when it is gone. */
export async function settingsOfVersion(db: DbOrTx, id: number | null): Promise<Settings> {
  if (!id) return getSettings(db);
  const [row] = await db
    .select({ data: settingsVersions.data })
    .from(settingsVersions)
    .where(eq(settingsVersions.id, id));
  const parsed = settingsSchema.safeParse(row?.data);
  return parsed.success ? parsed.data : getSettings(db);
}

export type SettingsCache = {
  /** The version in force, kept for a few seconds. */
  current(db: DbOrTx): Promise<CurrentSettings>;
  /** The settings in force, kept for a few seconds. */
  get(db: DbOrTx): Promise<Settings>;
  /** After a save: the next read goes to the database. */
  invalidate(): void;
};

/**
 * A save in this process clears the cache at once; other API processes behind the balancer see the change within the
 * time limit.
 */
export function createSettingsCache(ttlMs = 5_000): SettingsCache {
  let kept: { value: CurrentSettings; at: number } | null = null;
  async function current(db: DbOrTx): Promise<CurrentSettings> {
    const now = Date.now();
    if (kept && now - kept.at < ttlMs) return kept.value;
    const value = await readCurrentSettings(db);
    kept = { value, at: now };
    return value;
  }
  return {
    current,
    get: async (db) => (await current(db)).settings,
    invalidate: () => {
      kept = null;
    },
  };
}
