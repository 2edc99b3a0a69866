import { randomUUID } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import type { Logger } from '../lib/logger';
import { clientAddress } from '../lib/client-address';

// Invitation and reset links carry their secret in the path; the log keeps the route, not the secret (ASVS 7.1.1).
const SECRET_PATHS = /^(\/api\/(?:invitations|password-reset))\/[^/?#]+/;
export const loggableUrl = (url: string) => url.replace(SECRET_PATHS, '$1/:token');

export function requestLog(logger: Logger) {
  return (req: Request, res: Response, next: NextFunction) => {
    const incoming = req.get('x-request-id');
    req.requestId = incoming && /^[\w-]{1,64}$/.test(incoming) ? incoming : randomUUID();
    res.setHeader('X-Request-Id', req.requestId);
    const started = process.hrtime.bigint();
    res.on('finish', () => {
      const ms = Number(process.hrtime.bigint() - started) / 1e6;
      logger.info(
        {
          requestId: req.requestId,
          method: req.method,
          url: loggableUrl(req.originalUrl),
          status: res.statusCode,
          ms: Math.round(ms * 10) / 10,
          user: req.user?.id,
          ip: clientAddress(req),
        },
        'request',
      );
    });
    next();
  };
}
