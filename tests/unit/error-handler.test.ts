import { describe, expect, it } from 'vitest';
import type { NextFunction, Request, Response } from 'express';
import { errorHandler } from '../../server/middleware/error-handler';
import { createLogger } from '../../server/lib/logger';

function answer(err: unknown) {
  const out: { status?: number; body?: unknown; headers: Record<string, string> } = { headers: {} };
  const res = {
    headersSent: false,
    status(s: number) {
      out.status = s;
      return this;
    },
    json(b: unknown) {
      out.body = b;
      return this;
    },
    setHeader(k: string, v: string) {
      out.headers[k] = v;
    },
  } as unknown as Response;
  errorHandler(createLogger('silent'))(err, { requestId: 'r1' } as Request, res, (() => undefined) as NextFunction);
  return out;
}

// drizzle wraps the driver's error in `cause`.
const fromDriver = (code: string) =>
  Object.assign(new Error('Failed query'), { cause: Object.assign(new Error(code), { code }) });

describe('error handler', () => {
  it('answers 409 when a write names a site or unit that a concurrent request removed before it committed', () => {
    const out = answer(fromDriver('ER_NO_REFERENCED_ROW_2'));
    expect(out.status).toBe(409);
    expect(out.body).toMatchObject({
      error: { code: 'conflict', message: expect.stringMatching(/removed meanwhile/) },
    });
  });

  it('answers 500 with a reference and no detail for anything unforeseen', () => {
    const out = answer(new Error('boom at line 3'));
    expect(out.status).toBe(500);
    expect(JSON.stringify(out.body)).not.toContain('boom');
  });
});
