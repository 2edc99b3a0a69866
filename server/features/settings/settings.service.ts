import type { DbOrTx } from '../../db/client';
import { DEFAULT_SETTINGS, type Settings } from '../../../shared/schemas/settings';

/** The settings in force. Stored settings replace these defaults once the settings screen exists. */
export async function getSettings(_db: DbOrTx): Promise<Settings> {
  return DEFAULT_SETTINGS;
}
