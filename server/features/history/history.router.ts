import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { numericIdParam } from '../../lib/id-params';
import { sendStoredFile, type Storage } from '../../lib/storage';
import { attachmentUpload } from '../../middleware/upload';
import {
  historyQuerySchema,
  overviewsQuerySchema,
  recordVisitByLabelSchema,
  recordVisitSchema,
  voidEventSchema,
} from '../../../shared/schemas/history';
import { qrTokenParamSchema } from '../../../shared/schemas/labels';
import { getDepotPage, getUnitHistory, getUnitOverview, getUnitTimeline, unitIdByToken } from './history.queries';
import { recordVisit, recordVisitByLabel, voidEvent } from './visits.service';
import { addAttachments, readAttachment } from './attachments.service';

export function historyRoutes(ctx: AppContext & { storage: Storage }) {
  return [
    route('post', '/api/visits', 'record:event', async (req, res) => {
      // A visit names its unit, or (recorded offline at a label the phone had never opened) the label's token.
      const byLabel = typeof req.body === 'object' && req.body !== null && 'qrToken' in req.body;
      const result = byLabel
        ? await recordVisitByLabel(ctx, req.user!, recordVisitByLabelSchema.parse(req.body))
        : await recordVisit(ctx, req.user!, recordVisitSchema.parse(req.body));
      res.status(result.replayed ? 200 : 201).json(result);
    }),
    // Every role may void something: technicians and engineers their own recent entries, engineers, owners and admins
    // any entry; the service applies the rule for the role.
    route('post', '/api/events/:id/void', 'signed-in', async (req, res) => {
      const { id } = numericIdParam.parse(req.params);
      const { reason } = voidEventSchema.parse(req.body);
      res.status(201).json(await voidEvent(ctx, req.user!, id, reason));
    }),
    route(
      'post',
      '/api/events/:id/attachments',
      'record:event',
      async (req, res) => {
        const { id } = numericIdParam.parse(req.params);
        const files = (req.files as Express.Multer.File[] | undefined) ?? [];
        res.status(201).json({ attachments: await addAttachments(ctx, req.user!, id, files) });
      },
      [attachmentUpload(ctx.storage.tempDir)],
    ),
    // Photos show inline; anything else (PDFs) only downloads, so nothing uploaded runs in the app's origin
    // (ASVS 4.0 12.5.2). Not kept by the browser's cache: a shared phone holds nothing after sign-out (8.2.1).
    route('get', '/api/attachments/:id/file', 'view:unit', async (req, res) => {
      const { id } = numericIdParam.parse(req.params);
      const f = await readAttachment(ctx, id, 'file');
      const disposition = f.mimeType.startsWith('image/') ? 'inline' : 'attachment';
      const ascii = f.name.replace(/[^\x20-\x7e]|["\\]/g, '_');
      res.setHeader('Content-Type', f.mimeType);
      res.setHeader(
        'Content-Disposition',
        `${disposition}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(f.name)}`,
      );
      res.setHeader('Content-Security-Policy', "default-src 'none'; sandbox");
      res.setHeader('Cache-Control', 'private, no-store');
      await sendStoredFile(res, f.file);
    }),
    route('get', '/api/attachments/:id/thumbnail', 'view:unit', async (req, res) => {
      const { id } = numericIdParam.parse(req.params);
      const f = await readAttachment(ctx, id, 'thumbnail');
      res.setHeader('Content-Type', f.mimeType);
      res.setHeader('Cache-Control', 'private, no-store');
      await sendStoredFile(res, f.file);
    }),
    // A scanned label's figures, asked for alongside the unit itself (/api/units/by-token/:token): one round trip.
    route('get', '/api/units/by-token/:token/overview', 'view:unit', async (req, res) => {
      const { token } = qrTokenParamSchema.parse(req.params);
      res.json(await getUnitOverview(ctx.db, await unitIdByToken(ctx.db, token)));
    }),
    // A depot's units, a page at a time, for a phone keeping them for offline use.
    route('get', '/api/overviews', 'view:unit', async (req, res) => {
      const { siteId, after } = overviewsQuerySchema.parse(req.query);
      res.json(await getDepotPage(ctx.db, siteId, after));
    }),
    route('get', '/api/units/:id/overview', 'view:unit', async (req, res) => {
      const { id } = numericIdParam.parse(req.params);
      res.json(await getUnitOverview(ctx.db, id));
    }),
    route('get', '/api/units/:id/history', 'view:unit', async (req, res) => {
      const { id } = numericIdParam.parse(req.params);
      const q = historyQuerySchema.parse(req.query);
      res.json(await getUnitHistory(ctx.db, id, q.before, q.limit));
    }),
    route('get', '/api/units/:id/timeline', 'view:unit', async (req, res) => {
      const { id } = numericIdParam.parse(req.params);
      res.json(await getUnitTimeline(ctx.db, id, ctx.clock.now(), await ctx.caches.settings.get(ctx.db)));
    }),
  ];
}
