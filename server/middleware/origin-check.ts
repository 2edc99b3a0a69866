import type { NextFunction, Request, Response } from 'express';
import { HttpError } from '../lib/http-error';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * The origins a state-changing request may come from: PUBLIC_URL's, and when that is http://localhost the same port
 * on the loopback addresses (a person may type either). Never the request's own Host header: under DNS rebinding an
 * attacker's name points at this server, and Origin then equals Host.
 */
export function allowedOrigins(publicUrl: string): string[] {
  const url = new URL(publicUrl);
  const origins = [url.origin];
  if (url.hostname === 'localhost') {
    for (const host of ['127.0.0.1', '[::1]'])
      origins.push(`${url.protocol}//${host}${url.port ? `:${url.port}` : ''}`);
  }
  return origins;
}

// Cookie sessions need a CSRF guard: a state-changing request must come from our own origin.
export function originCheck(origins: string[]) {
  const allowed = new Set(origins.map((o) => o.toLowerCase()));
  return (req: Request, _res: Response, next: NextFunction) => {
    if (SAFE.has(req.method)) return next();
    const origin = req.get('origin');
    if (origin == null || !allowed.has(origin.toLowerCase())) {
      return next(new HttpError(403, 'bad_origin', 'This request did not come from the Tightloop app.'));
    }
    next();
  };
}
