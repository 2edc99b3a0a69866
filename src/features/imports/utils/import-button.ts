import { fmtCount } from '../../../lib/format';

/**
 * The import button's words: how many units go in, or — while something stands in the way (rows with errors, units
 * already registered, nothing new) — that nothing can go in yet, never a count that would not be imported.
 */
export function importButtonLabel(readyCount: number | undefined, blocked: boolean): string {
  if (readyCount === undefined) return 'Import units';
  if (blocked || readyCount === 0) return 'Nothing can be imported yet';
  return `Import ${fmtCount(readyCount)} ${readyCount === 1 ? 'unit' : 'units'}`;
}
