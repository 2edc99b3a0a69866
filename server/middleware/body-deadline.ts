// A form or JSON body is a few kilobytes; one that is still arriving after a few seconds comes from a client that
// holds the connection on purpose (or from a link too poor to use). Uploads are left to the server's longer
// request timeout (lib/http-server.ts), since photos and fleet files are megabytes.
import type { NextFunction, Request, RequestHandler, Response } from 'express';

export const JSON_BODY_DEADLINE_MS = 15_000;

const hasBody = (req: Request) =>
  req.headers['transfer-encoding'] !== undefined || Number(req.headers['content-length'] ?? 0) > 0;

export function bodyDeadline(ms: number = JSON_BODY_DEADLINE_MS): RequestHandler {
  return (req: Request, res: Response, next: NextFunction) => {
    if (req.complete || !hasBody(req) || req.is('multipart/form-data')) return next();
    const timer = setTimeout(() => {
      if (req.complete) return;
      // Answer, then drop the connection: the rest of the body is not worth waiting for.
      res.once('finish', () => req.socket.destroy());
      if (res.headersSent) return req.socket.destroy();
      res
        .status(408)
        .set('Connection', 'close')
        .json({
          error: {
            code: 'request_timeout',
            message: `The request body did not arrive within ${Math.round(ms / 1000)} seconds.`,
          },
        });
    }, ms);
    timer.unref();
    const done = () => clearTimeout(timer);
    req.once('end', done);
    req.once('close', done);
    next();
  };
}
