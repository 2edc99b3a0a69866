import {
  handoverQuerySchema,
  type HandoverExport,
  type HandoverFileLine,
  type HandoverProgressLine,
} from '../../../shared/schemas/handover';
import type { AppContext } from '../../lib/app-context';
import { unitIdParam } from '../../lib/id-params';
import { route } from '../../lib/route';
import { sendPdf } from '../../lib/pdf/pdf-parts';
import { buildHandover, thumbnailsOf } from './handover.service';
import { renderHandoverPdf, type HandoverProgress } from './handover-pdf';

const fileName = (x: HandoverExport, ext: string) =>
  `tightloop-handover-${x.record.unit.containerNumber}-${x.producedAt.slice(0, 10)}.${ext}`;

export function handoverRoutes(ctx: AppContext) {
  const produce = async (unitId: number, query: unknown, progress?: HandoverProgress) => {
    const x = await buildHandover(ctx.db, unitId, handoverQuerySchema.parse(query), ctx.clock.now());
    const photoIds = x.record.events.flatMap((e) =>
      e.attachments.filter((a) => a.mimeType.startsWith('image/')).map((a) => a.id),
    );
    const pdf = await renderHandoverPdf(x, await thumbnailsOf(ctx.db, ctx.storage, photoIds), progress);
    return { x, pdf };
  };
  return [
    route('get', '/api/units/:id/handover.json', 'view:fleet', async (req, res) => {
      const { id } = unitIdParam.parse(req.params);
      const x = await buildHandover(ctx.db, id, handoverQuerySchema.parse(req.query), ctx.clock.now());
      res.setHeader('Content-Disposition', `attachment; filename="${fileName(x, 'json')}"`);
      res.setHeader('Cache-Control', 'no-store');
      res.json(x);
    }),
    route('get', '/api/units/:id/handover.pdf', 'view:fleet', async (req, res) => {
      const { id } = unitIdParam.parse(req.params);
      const { x, pdf } = await produce(id, req.query);
      res.setHeader('X-Record-Checksum', x.checksum);
      sendPdf(res, pdf, fileName(x, 'pdf'), 'attachment');
    }),
    // The same PDF with its progress (handoverLineDto): progress lines while the pages are drawn, then the file.
    // Errors before the first line are ordinary JSON errors.
    route('get', '/api/units/:id/handover/progress', 'view:fleet', async (req, res) => {
      const { id } = unitIdParam.parse(req.params);
      const query = handoverQuerySchema.parse(req.query);
      const x0 = await buildHandover(ctx.db, id, query, ctx.clock.now());
      res.setHeader('Content-Type', 'application/x-ndjson; charset=utf-8');
      res.setHeader('Cache-Control', 'no-store');
      let last = 0;
      const { x, pdf } = await produce(id, query, (done, total) => {
        const now = Date.now();
        if (done === total || now - last > 100) {
          last = now;
          res.write(`${JSON.stringify({ done, total } satisfies HandoverProgressLine)}\n`);
        }
      });
      const file: HandoverFileLine = {
        fileName: fileName(x, 'pdf'),
        checksum: x.checksum,
        events: x0.record.events.length,
        pdf: Buffer.from(pdf).toString('base64'),
      };
      res.end(`${JSON.stringify(file)}\n`);
    }),
  ];
}
