/**
 * A random key for a write that may be sent again (the server answers a key it knows with the first result): 128 bits
 * as 32 hex characters, which every idempotency and import key schema accepts. `crypto.getRandomValues` works outside
 * a secure context too; `crypto.randomUUID` throws when the app is opened over plain HTTP on a LAN address.
 */
export function newIdempotencyKey(): string {
  return Array.from(crypto.getRandomValues(new Uint8Array(16)), (b) => b.toString(16).padStart(2, '0')).join('');
}
