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

/** A random key for a write that may be retried (idempotency); works outside secure contexts too. */
export const newKey = () =>
  Array.from(crypto.getRandomValues(new Uint8Array(16)), (b) => b.toString(16).padStart(2, '0')).join('');
