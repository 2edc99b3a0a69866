import type { NextFunction, Request, RequestHandler, Response } from 'express';
import multer from 'multer';
import { HttpError } from '../lib/http-error';

type Options = {
  field: string;
  maxBytes: number;
  /** Refuses a file by throwing an HttpError whose message tells the person what to upload instead. */
  accept: (file: Express.Multer.File) => void;
  /** Said in the 413 message, e.g. "25 MB". */
  limitText: string;
};

/** One file in memory, with multer's errors turned into the API's JSON errors (never a 500 for a bad upload). */
export function singleFileUpload(opts: Options): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: opts.maxBytes, files: 1, fields: 20, fieldSize: 64 * 1024 },
    fileFilter: (_req, file, cb) => {
      try {
        opts.accept(file);
        cb(null, true);
      } catch (err) {
        cb(err as Error);
      }
    },
  }).single(opts.field);

  return (req: Request, res: Response, next: NextFunction) => {
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof HttpError) return next(err);
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          return next(new HttpError(413, 'too_large', `The file is larger than ${opts.limitText}.`));
        }
        const message =
          err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT'
            ? `Upload one file in the "${opts.field}" field.`
            : 'The upload could not be read.';
        return next(new HttpError(400, 'bad_upload', message));
      }
      // A broken multipart body (cut connection, bad boundary) is the sender's fault.
      next(new HttpError(400, 'bad_upload', 'The upload could not be read. Try again.'));
    });
  };
}
