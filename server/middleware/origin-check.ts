import type { NextFunction, Request, Response } from 'express';
import { HttpError } from '../lib/http-error';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

// Cookie sessions need a CSRF guard: a state-changing request must come from our own origin.
export function originCheck(allowedOrigins: string[]) {
  return (req: Request, _res: Response, next: NextFunction) => {
    if (SAFE.has(req.method)) return next();
    const origin = req.get('origin');
    const host = req.get('host');
    const ok =
      origin != null &&
      (allowedOrigins.includes(origin) || (host != null && safeHost(origin) === host.toLowerCase()));
    if (!ok) return next(new HttpError(403, 'bad_origin', 'This request did not come from the Tightloop app.'));
    next();
  };
}

function safeHost(origin: string): string | null {
  try {
    return new URL(origin).host.toLowerCase();
  } catch {
    return null;
  }
}
