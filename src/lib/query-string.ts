/** A query string from an object: empty values, false flags and defaults are left out. */
export function toSearch(values: Record<string, unknown>, defaults: Record<string, unknown> = {}): string {
  const sp = new URLSearchParams();
  for (const [k, v] of Object.entries(values)) {
    if (v === undefined || v === null || v === '' || v === false) continue;
    if (defaults[k] !== undefined && defaults[k] === v) continue;
    sp.set(k, v === true ? '1' : String(v));
  }
  return sp.toString();
}
