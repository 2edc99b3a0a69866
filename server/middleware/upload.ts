// Multipart uploads streamed to a temporary file on disk, never held in memory. Size and count limits are enforced
// as the bytes arrive (multer/busboy stop at the limit), the first bytes are checked while streaming so a wrong type
// stops at once, and every temporary file is deleted again on every way a request can end: refused, failed, aborted,
// or finished without the handler keeping it (keeping = the storage moving it away).
import { createHash, randomBytes } from 'node:crypto';
import { createWriteStream, type WriteStream } from 'node:fs';
import { mkdir, readdir, rm, stat } from 'node:fs/promises';
import path from 'node:path';
import { Transform } from 'node:stream';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import multer from 'multer';
import { acceptCsvHead, acceptCsvUpload } from '../lib/csv-read';
import { HttpError, badRequest } from '../lib/http-error';
import { sniffMimeType } from '../lib/storage';
import { MAX_PHOTOS_PER_EVENT, MAX_UPLOAD_BYTES } from '../../shared/schemas/history';

/** What the handler receives for each file (as req.file / req.files): where it is, its size and its SHA-256. */
export type ReceivedFile = Express.Multer.File & { sha256: string };

type FileInfo = { originalname: string; mimetype: string };

type Options = {
  field: string;
  maxFiles: number;
  maxBytes: number;
  /** Said in the 413 message, e.g. "25 MB". */
  limitText: string;
  /** The folder uploads stream into; the storage's own, so keeping a file is a rename. */
  tempDir: string;
  /** Refuses a file by its name and declared type before a byte is written (throws an HttpError). */
  acceptFile?: (file: FileInfo) => void;
  /** Refuses a file by its first bytes while it streams (throws an HttpError). */
  acceptHead?: (head: Buffer, file: FileInfo) => void;
  tooManyMessage?: string;
};

/** How many leading bytes acceptHead sees (or the whole file when it is shorter). */
const HEAD_BYTES = 16;
/** Files a crashed process left behind are removed once they are this old. */
const STALE_MS = 60 * 60 * 1000;
/** A request cut off after the handler took its files: the handler cleans up itself; this is the backstop. */
const ABORTED_SWEEP_DELAY_MS = 60_000;

const readyDirs = new Map<string, Promise<void>>();

/** Makes the folder once per process and clears out what an earlier process may have left there. */
function ensureTempDir(dir: string): Promise<void> {
  let ready = readyDirs.get(dir);
  if (!ready) {
    ready = (async () => {
      await mkdir(dir, { recursive: true });
      const cutoff = Date.now() - STALE_MS;
      for (const name of await readdir(dir)) {
        if (!name.endsWith('.part')) continue;
        const file = path.join(dir, name);
        const info = await stat(file).catch(() => null);
        if (info && info.mtimeMs < cutoff) await rm(file, { force: true });
      }
    })();
    readyDirs.set(dir, ready);
  }
  return ready;
}

const removeQuietly = (file: string) => rm(file, { force: true }).catch(() => {});

const tempFilesOf = new WeakMap<Request, Set<string>>();

/** Removes the temporary files of a request that are still there (a kept file has been moved away already). */
export function removeTempFiles(req: Request): Promise<void> {
  const files = tempFilesOf.get(req);
  if (!files) return Promise.resolve();
  const all = [...files];
  files.clear();
  return Promise.all(all.map(removeQuietly)).then(() => undefined);
}

/** A multer storage engine writing each file to `dir`, hashing it and checking its head on the way. */
function tempFileStorage(dir: string, acceptHead: Options['acceptHead']): multer.StorageEngine {
  return {
    _handleFile(req, file, cb) {
      const target = path.join(dir, `${randomBytes(12).toString('hex')}.part`);
      tempFilesOf.get(req)?.add(target);
      // Set at once, so multer's own abort clean-up finds a file that is still being written.
      (file as { path?: string }).path = target;
      const hash = createHash('sha256');
      let size = 0;
      let head: Buffer | null = Buffer.alloc(0);
      const checkHead = () => {
        const h = head!;
        head = null;
        acceptHead?.(h, file);
      };
      const tap = new Transform({
        transform(chunk: Buffer, _enc, done) {
          try {
            if (head) {
              head = Buffer.concat([head, chunk.subarray(0, HEAD_BYTES - head.length)]);
              if (head.length >= HEAD_BYTES) checkHead();
            }
            hash.update(chunk);
            size += chunk.length;
            done(null, chunk);
          } catch (err) {
            done(err as Error);
          }
        },
        flush(done) {
          try {
            if (head) checkHead();
            done();
          } catch (err) {
            done(err as Error);
          }
        },
      });
      let out: WriteStream | null = null;
      let failed = false;
      const fail = (err: unknown) => {
        if (failed) return;
        failed = true;
        // Never destroy busboy's stream (it would wait for it forever); read the rest of the file and drop it.
        file.stream.unpipe(tap);
        file.stream.resume();
        tap.destroy();
        out?.destroy();
        void removeQuietly(target).then(() => cb(err as Error));
      };
      file.stream.on('error', fail);
      tap.on('error', fail);
      ensureTempDir(dir).then(() => {
        if (failed) return;
        const stream = (out = createWriteStream(target, { flags: 'wx' }));
        stream.on('error', fail);
        stream.on('close', () => {
          if (failed || !stream.writableFinished) return;
          cb(null, { path: target, size, sha256: hash.digest('hex') } as Partial<ReceivedFile>);
        });
        file.stream.pipe(tap).pipe(stream);
      }, fail);
    },
    _removeFile(_req, file, cb) {
      rm(file.path, { force: true }).then(() => cb(null), cb);
    },
  };
}

function fileUpload(opts: Options): RequestHandler {
  const upload = multer({
    storage: tempFileStorage(opts.tempDir, opts.acceptHead),
    limits: {
      fileSize: opts.maxBytes,
      files: opts.maxFiles,
      fields: 20,
      fieldSize: 64 * 1024,
      parts: opts.maxFiles + 20,
    },
    fileFilter: (_req, file, cb) => {
      try {
        opts.acceptFile?.(file);
        cb(null, true);
      } catch (err) {
        cb(err as Error);
      }
    },
  });
  const parse = opts.maxFiles === 1 ? upload.single(opts.field) : upload.array(opts.field, opts.maxFiles);
  const tooMany = opts.tooManyMessage ?? `Upload one file in the "${opts.field}" field.`;

  return (req: Request, res: Response, next: NextFunction) => {
    tempFilesOf.set(req, new Set());
    let handedOver = false;
    res.once('close', () => {
      // Answered: the handler is done with the files (handlers keep nothing they have not moved before answering).
      // Cut off before the handler had them: remove them now. Cut off while the handler works: it may still be
      // reading them, so remove them a minute later.
      if (res.writableFinished || !handedOver) void removeTempFiles(req);
      else setTimeout(() => void removeTempFiles(req), ABORTED_SWEEP_DELAY_MS).unref();
    });
    parse(req, res, (err: unknown) => {
      if (!err) {
        handedOver = true;
        return next();
      }
      void removeTempFiles(req);
      if (err instanceof HttpError) return next(err);
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          const message =
            opts.maxFiles === 1
              ? `The file is larger than ${opts.limitText}.`
              : `Each file must be ${opts.limitText} or less.`;
          return next(new HttpError(413, 'too_large', message));
        }
        if (err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT') {
          return next(new HttpError(400, opts.maxFiles > 1 ? 'too_many_files' : 'bad_upload', tooMany));
        }
        return next(new HttpError(400, 'bad_upload', 'The upload could not be read.'));
      }
      // A broken multipart body (cut connection, bad boundary) is the sender's fault.
      next(new HttpError(400, 'bad_upload', 'The upload could not be read. Try again.'));
    });
  };
}

/** One file (req.file), e.g. the fleet CSV. */
export function singleFileUpload(opts: Omit<Options, 'maxFiles' | 'tooManyMessage'>): RequestHandler {
  return fileUpload({ ...opts, maxFiles: 1 });
}

/** One CSV file (req.file, field "file"), refused while it arrives when it is a workbook, a PDF or too large. */
export function csvUpload(tempDir: string, maxBytes: number): RequestHandler {
  return singleFileUpload({
    field: 'file',
    maxBytes,
    limitText: `${maxBytes / 1024 / 1024} MB`,
    tempDir,
    acceptFile: acceptCsvUpload,
    acceptHead: acceptCsvHead,
  });
}

/** The CSV file the request carries, or a 400 that asks for one. */
export function requireCsvFile(file: Express.Multer.File | undefined): Express.Multer.File {
  if (!file) throw badRequest('Choose a CSV file to upload.', { file: 'Choose a CSV file' });
  return file;
}

/** Photos and documents of an entry (req.files): JPEG, PNG, WebP or PDF by their first bytes, whatever the name. */
export function attachmentUpload(tempDir: string): RequestHandler {
  return fileUpload({
    field: 'files',
    maxFiles: MAX_PHOTOS_PER_EVENT,
    maxBytes: MAX_UPLOAD_BYTES,
    limitText: `${MAX_UPLOAD_BYTES / 1024 / 1024} MB`,
    tempDir,
    tooManyMessage: `Send at most ${MAX_PHOTOS_PER_EVENT} files, in the field "files".`,
    acceptHead: (head, file) => {
      if (!sniffMimeType(head)) {
        throw new HttpError(415, 'unsupported_type', `${file.originalname} is not a JPEG, PNG, WebP or PDF file.`, {
          files: 'Only JPEG, PNG, WebP or PDF',
        });
      }
    },
  });
}
