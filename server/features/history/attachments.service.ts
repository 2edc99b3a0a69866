import { readFile } from 'node:fs/promises';
import { eq, or, sql } from 'drizzle-orm';
import sharp from 'sharp';
import type { AppContext } from '../../lib/app-context';
import type { DbOrTx } from '../../db/client';
import { attachments, events } from '../../db/schema';
import { badRequest, HttpError, notFound } from '../../lib/http-error';
import { sniffFile, type SniffedType } from '../../lib/storage';
import { activePdfContent } from '../../lib/pdf-active-content';
import type { SessionUser } from '../../lib/session';
import { MAX_PHOTOS_PER_EVENT } from '../../../shared/schemas/history';
import { attachmentDto } from './history.mapper';

/** An upload streamed to a temporary file (middleware/upload.ts); its SHA-256 when the upload computed it. */
export type UploadedFile = { path: string; originalname: string; size: number; sha256?: string };

const THUMBNAIL_PX = 320;

async function attachmentCount(db: DbOrTx, eventId: number): Promise<number> {
  const [{ n }] = await db
    .select({ n: sql<number>`count(*)` })
    .from(attachments)
    .where(eq(attachments.eventId, eventId));
  return Number(n);
}

const tooMany = (n: number) =>
  badRequest(`An entry holds at most ${MAX_PHOTOS_PER_EVENT} files; it has ${n}.`, { files: 'Too many files' });

/** Removes stored files this request added, unless an attachment has come to use the same content meanwhile. */
async function takeBack(ctx: AppContext, keys: string[]) {
  for (const key of keys) {
    const [used] = await ctx.db
      .select({ id: attachments.id })
      .from(attachments)
      .where(or(eq(attachments.storageKey, key), eq(attachments.thumbnailKey, key)))
      .limit(1);
    if (!used) await ctx.storage.remove(key);
  }
}

export async function addAttachments(ctx: AppContext, user: SessionUser, eventId: number, files: UploadedFile[]) {
  if (!files.length) throw badRequest('Choose at least one photo or document.', { files: 'No file received' });
  const [event] = await ctx.db
    .select({ id: events.id, unitId: events.unitId, kind: events.kind })
    .from(events)
    .where(eq(events.id, eventId));
  if (!event || event.kind === 'void') throw notFound('No such entry.');
  const before = await attachmentCount(ctx.db, eventId);
  if (before + files.length > MAX_PHOTOS_PER_EVENT) throw tooMany(before);

  // Every file is checked by its content (its first bytes, and an image must decode) before any is kept.
  const checked: (UploadedFile & { mimeType: SniffedType; thumbnail: Buffer | null })[] = [];
  for (const [i, f] of files.entries()) {
    const mimeType = await sniffFile(f.path);
    if (!mimeType) {
      throw new HttpError(415, 'unsupported_type', `${f.originalname} is not a JPEG, PNG, WebP or PDF file.`, {
        [`files.${i}`]: 'Only JPEG, PNG, WebP or PDF',
      });
    }
    if (mimeType === 'application/pdf') {
      const active = await activePdfContent(await readFile(f.path));
      if (active) {
        throw new HttpError(
          415,
          'active_content',
          `${f.originalname} contains ${active === 'Encrypt' ? 'encryption' : `active content (${active})`}, which Tightloop does not keep.`,
          {
            [`files.${i}`]:
              'Save or print it as a plain PDF without scripts, attachments or a password, then upload that',
          },
        );
      }
    }
    let thumbnail: Buffer | null = null;
    if (mimeType !== 'application/pdf') {
      try {
        thumbnail = await sharp(f.path)
          .rotate()
          .resize(THUMBNAIL_PX, THUMBNAIL_PX, { fit: 'inside' })
          .webp({ quality: 70 })
          .toBuffer();
      } catch {
        throw new HttpError(415, 'unreadable_image', `${f.originalname} could not be read as an image.`, {
          [`files.${i}`]: 'Not a readable image',
        });
      }
    }
    checked.push({ ...f, mimeType, thumbnail });
  }

  // Keep the files (content-addressed, so a retry is harmless), then record them in one transaction; if that is
  // refused, take back what was added.
  const added: string[] = [];
  try {
    const stored: { f: (typeof checked)[number]; storageKey: string; thumbnailKey: string | null }[] = [];
    for (const f of checked) {
      const file = await ctx.storage.putFile(f.path, f.sha256);
      if (file.created) added.push(file.key);
      let thumbnailKey: string | null = null;
      if (f.thumbnail) {
        const thumb = await ctx.storage.put(f.thumbnail);
        if (thumb.created) added.push(thumb.key);
        thumbnailKey = thumb.key;
      }
      stored.push({ f, storageKey: file.key, thumbnailKey });
    }
    const rows = await ctx.db.transaction(async (tx) => {
      await tx.select({ id: events.id }).from(events).where(eq(events.id, eventId)).for('update');
      const n = await attachmentCount(tx, eventId);
      if (n + stored.length > MAX_PHOTOS_PER_EVENT) throw tooMany(n);
      const ids: number[] = [];
      for (const { f, storageKey, thumbnailKey } of stored) {
        const [r] = await tx
          .insert(attachments)
          .values({
            eventId,
            unitId: event.unitId,
            storageKey,
            thumbnailKey,
            mimeType: f.mimeType,
            sizeBytes: f.size,
            originalName: f.originalname.slice(0, 255),
            uploadedBy: user.id,
          })
          .$returningId();
        ids.push(r.id);
      }
      return tx
        .select()
        .from(attachments)
        .where(
          sql`${attachments.id} IN (${sql.join(
            ids.map((i) => sql`${i}`),
            sql`, `,
          )})`,
        );
    });
    return rows.map(attachmentDto);
  } catch (err) {
    await takeBack(ctx, added);
    throw err;
  }
}

export async function readAttachment(ctx: AppContext, id: number, variant: 'file' | 'thumbnail') {
  const [row] = await ctx.db.select().from(attachments).where(eq(attachments.id, id));
  const key = row && (variant === 'file' ? row.storageKey : row.thumbnailKey);
  if (!row || !key) throw notFound('No such file.');
  // Streamed to the response (local disk or S3), never held whole in memory.
  const file = await ctx.storage.open(key);
  if (!file) throw notFound('The file is missing from storage.');
  return { file, mimeType: variant === 'file' ? row.mimeType : 'image/webp', name: row.originalName };
}
