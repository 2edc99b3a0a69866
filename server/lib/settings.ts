// The settings in force: the newest row of `settings` (append-only versions), defaults until the first save. Every
// write reads them, so each app keeps the current version (createSettingsCache, owned by the app context) and checks
// before each use that no newer one has been saved, by any API process.
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
  /** The version in force. */
  current(db: DbOrTx): Promise<CurrentSettings>;
  /** The settings in force. */
  get(db: DbOrTx): Promise<Settings>;
  /** After a save: the next read goes to the database. */
  invalidate(): void;
};

/**
 * Keeps the version in force and, before each use, reads only the newest version's id (the primary key's last entry):
 * a save through any API process is used by every process from its next read on. Inside a write transaction the
 * check sees what has been committed, like any other read there.
 */
export function createSettingsCache(): SettingsCache {
  let kept: CurrentSettings | null = null;
  async function current(db: DbOrTx): Promise<CurrentSettings> {
    const [top] = await db
      .select({ id: settingsVersions.id })
      .from(settingsVersions)
      .orderBy(desc(settingsVersions.id))
      .limit(1);
    const newest = top?.id ?? 0;
    if (kept && kept.version === newest) return kept;
    kept = await readCurrentSettings(db);
    return kept;
  }
  return {
    current,
    get: async (db) => (await current(db)).settings,
    invalidate: () => {
      kept = null;
    },
  };
}
