import { eq, sql } from 'drizzle-orm';
import sharp from 'sharp';
import type { AppContext } from '../../deps';
import { attachments, events } from '../../db/schema';
import { badRequest, HttpError, notFound } from '../../lib/http-error';
import { sniffMimeType, type Storage } from '../../lib/storage';
import type { SessionUser } from '../../lib/session';
import { MAX_PHOTOS_PER_EVENT } from '../../../shared/schemas/history';
import { attachmentDto } from './history.service';

export type UploadedFile = { buffer: Buffer; originalname: string; size: number };

const THUMBNAIL_PX = 320;

export async function addAttachments(ctx: AppContext & { storage: Storage }, user: SessionUser, eventId: number, files: UploadedFile[]) {
  if (!files.length) throw badRequest('Choose at least one photo or document.', { files: 'No file received' });
  const [event] = await ctx.db.select({ id: events.id, unitId: events.unitId, kind: events.kind }).from(events).where(eq(events.id, eventId));
  if (!event || event.kind === 'void') throw notFound('No such entry.');
  const typed = files.map((f, i) => {
    const mimeType = sniffMimeType(f.buffer);
    if (!mimeType) {
      throw new HttpError(415, 'unsupported_type', `${f.originalname} is not a JPEG, PNG, WebP or PDF file.`, {
        [`files.${i}`]: 'Only JPEG, PNG, WebP or PDF',
      });
    }
    return { ...f, mimeType };
  });
  // Store the bytes first (content-addressed, so a retry is harmless), then record them in one transaction.
  const stored = await Promise.all(
    typed.map(async (f) => {
      const storageKey = await ctx.storage.put(f.buffer);
      let thumbnailKey: string | null = null;
      if (f.mimeType !== 'application/pdf') {
        try {
          const thumb = await sharp(f.buffer).rotate().resize(THUMBNAIL_PX, THUMBNAIL_PX, { fit: 'inside' }).webp({ quality: 70 }).toBuffer();
          thumbnailKey = await ctx.storage.put(thumb);
        } catch {
          throw new HttpError(415, 'unreadable_image', `${f.originalname} could not be read as an image.`);
        }
      }
      return { ...f, storageKey, thumbnailKey };
    }),
  );
  const rows = await ctx.db.transaction(async (tx) => {
    await tx.select({ id: events.id }).from(events).where(eq(events.id, eventId)).for('update');
    const [{ n }] = await tx.select({ n: sql<number>`count(*)` }).from(attachments).where(eq(attachments.eventId, eventId));
    if (Number(n) + stored.length > MAX_PHOTOS_PER_EVENT) {
      throw badRequest(`An entry holds at most ${MAX_PHOTOS_PER_EVENT} files; it has ${n}.`, { files: 'Too many files' });
    }
    const ids: number[] = [];
    for (const f of stored) {
      const [r] = await tx
        .insert(attachments)
        .values({
          eventId,
          unitId: event.unitId,
          storageKey: f.storageKey,
          thumbnailKey: f.thumbnailKey,
          mimeType: f.mimeType,
          sizeBytes: f.size,
          originalName: f.originalname.slice(0, 255),
          uploadedBy: user.id,
        })
        .$returningId();
      ids.push(r.id);
    }
    return tx.select().from(attachments).where(sql`${attachments.id} IN (${sql.join(ids.map((i) => sql`${i}`), sql`, `)})`);
  });
  return rows.map(attachmentDto);
}

export async function readAttachment(ctx: AppContext & { storage: Storage }, id: number, variant: 'file' | 'thumbnail') {
  const [row] = await ctx.db.select().from(attachments).where(eq(attachments.id, id));
  const key = row && (variant === 'file' ? row.storageKey : row.thumbnailKey);
  if (!row || !key) throw notFound('No such file.');
  const bytes = await ctx.storage.get(key);
  if (!bytes) throw notFound('The file is missing from storage.');
  return { bytes, mimeType: variant === 'file' ? row.mimeType : 'image/webp', name: row.originalName };
}
