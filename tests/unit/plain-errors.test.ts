import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import '../../shared/schemas/plain-errors';
import { recordVisitSchema } from '../../shared/schemas/history';

const messageOf = (schema: z.ZodType, value: unknown) => {
  const r = schema.safeParse(value);
  if (r.success) throw new Error('expected a failure');
  return r.error.issues[0].message;
};

describe('validator messages in plain words', () => {
  it('says "At least 30" rather than "Too small: expected number to be >=30"', () => {
    expect(messageOf(z.number().min(30), 12)).toBe('At least 30');
    expect(messageOf(z.number().max(1500), 2000)).toBe('At most 1,500');
    expect(messageOf(z.number().positive(), 0)).toBe('More than 0');
  });

  it('names text lengths, lists, whole numbers and missing fields the way a person would', () => {
    expect(messageOf(z.string().min(1), '')).toBe('Required');
    expect(messageOf(z.string().min(8), 'abc')).toBe('At least 8 characters');
    expect(messageOf(z.string().max(120), 'x'.repeat(121))).toBe('At most 120 characters');
    expect(messageOf(z.array(z.string()).min(1), [])).toBe('Add at least one');
    expect(messageOf(z.number().int(), 1.5)).toBe('Enter a whole number');
    expect(messageOf(z.object({ a: z.number() }), {})).toBe('Required');
    expect(messageOf(z.number(), 'ten')).toBe('Enter a number');
    expect(messageOf(z.email(), 'not-mail')).toMatch(/^Enter an e-mail address/);
  });

  it('never shows internal codes of an enum', () => {
    const m = messageOf(z.enum(['in_service', 'out_of_service']), 'sold');
    expect(m).toBe('Choose one of the options');
    expect(m).not.toMatch(/in_service/);
  });

  it('keeps a message a schema gives itself', () => {
    expect(messageOf(z.number().min(30, 'Thirty or more, please'), 1)).toBe('Thirty or more, please');
  });

  it('leaves no validator jargon in a real form schema', () => {
    const r = recordVisitSchema.safeParse({ unitId: 1, events: [{ kind: 'top_up', kg: -1 }] });
    expect(r.success).toBe(false);
    for (const issue of r.success ? [] : r.error.issues) {
      expect(issue.message).not.toMatch(/expected|Too small|Too big|Invalid input|>=|<=/);
    }
  });
});
