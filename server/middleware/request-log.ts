import { randomUUID } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import type { Logger } from '../lib/logger';

export function requestLog(logger: Logger) {
  return (req: Request, res: Response, next: NextFunction) => {
    const incoming = req.get('x-request-id');
    req.requestId = incoming && /^[\w-]{1,64}$/.test(incoming) ? incoming : randomUUID();
    res.setHeader('X-Request-Id', req.requestId);
    const started = process.hrtime.bigint();
    res.on('finish', () => {
      const ms = Number(process.hrtime.bigint() - started) / 1e6;
      logger.info(
        { requestId: req.requestId, method: req.method, url: req.originalUrl, status: res.statusCode, ms: Math.round(ms * 10) / 10, user: req.user?.id },
        'request',
      );
    });
    next();
  };
}
