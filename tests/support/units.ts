// Container numbers and sites for tests (units: createTestUnit in factories.ts).
import { containerCheckDigit } from '../../shared/domain';
import type { Db } from '../../server/db/client';
import { sites } from '../../server/db/schema';

/** A valid Halyard container number for a serial: HRLU + 6 digits + its ISO 6346 check digit. */
export function halyardNumber(serial: number, owner = 'HRL'): string {
  const first10 = `${owner}U${String(serial).padStart(6, '0')}`;
  return `${first10}${containerCheckDigit(first10)}`;
}

/** The same number with its check digit wrong, and the digit it should have been. */
export function withWrongCheckDigit(containerNumber: string): { number: string; expected: number } {
  const expected = Number(containerNumber.charAt(10));
  return { number: `${containerNumber.slice(0, 10)}${(expected + 1) % 10}`, expected };
}

let siteCounter = 0;
export async function createTestSite(db: Db, overrides: Partial<typeof sites.$inferInsert> = {}) {
  siteCounter += 1;
  const row = {
    code: `T-${Date.now() % 100000}-${siteCounter}`,
    name: `Test depot ${siteCounter}`,
    kind: 'depot' as const,
    country: 'NL',
    ...overrides,
  };
  const [{ id }] = await db.insert(sites).values(row).$returningId();
  return { id, ...row };
}
