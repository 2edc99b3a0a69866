import type { NextFunction, Request, Response } from 'express';
import { ZodError } from 'zod';
// Field errors in plain words (one error map for the API and the forms).
import '../../shared/schemas/plain-errors';
import { HttpError } from '../lib/http-error';
import type { Logger } from '../lib/logger';
import { DATABASE_RETRY_AFTER_SECONDS, isDatabaseUnavailable } from '../lib/db-unavailable';
import { isMissingParentError } from '../lib/db-errors';

export function zodFields(error: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

type BodyParserError = Error & { type?: string; status?: number };

export function errorHandler(logger: Logger) {
  // Express recognises an error handler by its four parameters.
  return (err: unknown, req: Request, res: Response, _next: NextFunction) => {
    const send = (status: number, code: string, message: string, fields?: Record<string, string>) => {
      if (res.headersSent) return;
      res.status(status).json({ error: fields ? { code, message, fields } : { code, message } });
    };
    if (err instanceof HttpError) {
      const retryAfter = (err as HttpError & { retryAfterSeconds?: number }).retryAfterSeconds;
      if (retryAfter !== undefined && !res.headersSent) res.setHeader('Retry-After', String(retryAfter));
      return send(err.status, err.code, err.message, err.fields);
    }
    if (err instanceof ZodError) return send(400, 'invalid_input', 'Some fields need attention.', zodFields(err));
    const bp = err as BodyParserError;
    if (bp?.type === 'entity.parse.failed') return send(400, 'invalid_json', 'The request body is not valid JSON.');
    if (bp?.type === 'entity.too.large') return send(413, 'too_large', 'The request is too large.');
    if (typeof bp?.status === 'number' && bp.status >= 400 && bp.status < 500) {
      return send(bp.status, 'bad_request', bp.message || 'Bad request.');
    }
    // Each service checks what a write refers to; a parent removed between that check and the commit is a race the
    // person can resolve by reloading, not a server fault.
    if (isMissingParentError(err)) {
      return send(
        409,
        'conflict',
        'Something this refers to (a site, a unit) was removed meanwhile. Reload and try again.',
      );
    }
    if (isDatabaseUnavailable(err)) {
      logger.error({ err, requestId: req.requestId }, 'database unavailable');
      if (!res.headersSent) res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
      return send(503, 'database_unavailable', 'The server cannot reach its database. Try again shortly.');
    }
    logger.error({ err, requestId: req.requestId }, 'unhandled error');
    send(500, 'internal', `Something went wrong on our side. Reference: ${req.requestId}`);
  };
}
