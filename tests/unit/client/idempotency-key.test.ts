import { describe, expect, it, vi } from 'vitest';
import { markForInspectionSchema } from '../../../shared/schemas/trace';
import { recordVisitSchema } from '../../../shared/schemas/history';
import { recordDecisionSchema } from '../../../shared/schemas/decisions';
import { importCommitFormSchema } from '../../../shared/schemas/imports';
import { newIdempotencyKey } from '../../../src/lib/idempotency-key';

describe('newIdempotencyKey', () => {
  it('makes 128 random bits as 32 hex characters, a new one each time', () => {
    const keys = new Set(Array.from({ length: 1000 }, () => newIdempotencyKey()));
    expect(keys.size).toBe(1000);
    for (const k of keys) expect(k).toMatch(/^[0-9a-f]{32}$/);
  });

  it('works where crypto.randomUUID is missing, as on a plain-HTTP LAN address', () => {
    const spy = vi.spyOn(crypto, 'randomUUID').mockImplementation(() => {
      throw new TypeError('crypto.randomUUID is not a function');
    });
    try {
      expect(newIdempotencyKey()).toMatch(/^[0-9a-f]{32}$/);
    } finally {
      spy.mockRestore();
    }
  });

  it('is accepted by every write that takes a key: visits, decisions, trace marks and imports', () => {
    const key = newIdempotencyKey();
    expect(recordVisitSchema.shape.idempotencyKey.safeParse(key).success).toBe(true);
    expect(recordDecisionSchema.shape.idempotencyKey.safeParse(key).success).toBe(true);
    expect(markForInspectionSchema.shape.idempotencyKey.safeParse(key).success).toBe(true);
    expect(importCommitFormSchema.shape.importKey.safeParse(key).success).toBe(true);
  });
});
