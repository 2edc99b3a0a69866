import { eq } from 'drizzle-orm';
import {
  MAX_CYLINDER_IMPORT_BYTES,
  cylinderCodeParamSchema,
  cylinderIdParamSchema,
  cylinderListQuerySchema,
  cylinderStatusChangeSchema,
  createCylinderSchema,
  weighingSchema,
} from '../../../shared/schemas/cylinders';
import { cylinders } from '../../db/schema';
import type { AppContext } from '../../lib/app-context';
import { notFound } from '../../lib/http-error';
import { route } from '../../lib/route';
import { csvUpload, requireCsvFile } from '../../middleware/upload';
import { sendPdf } from '../../lib/pdf/pdf-parts';
import { renderCylinderLabel } from './cylinder-label';
import { cylinderTemplateCsv, importCylinders } from './cylinder-import.service';
import {
  addWeighing,
  changeStatus,
  createCylinder,
  cylinderLabelUrl,
  getCylinder,
  getCylinderByCode,
  listCylinders,
} from './cylinders.service';

export function cylindersRoutes(ctx: AppContext) {
  const upload = csvUpload(ctx.storage.tempDir, MAX_CYLINDER_IMPORT_BYTES);
  return [
    route('get', '/api/cylinders', 'view:unit', async (req, res) => {
      res.json(await listCylinders(ctx, cylinderListQuerySchema.parse(req.query)));
    }),
    route('post', '/api/cylinders', 'manage:units', async (req, res) => {
      const input = createCylinderSchema.parse(req.body);
      res.status(201).json(await createCylinder(ctx, req.user!, input));
    }),
    route('get', '/api/cylinders/by-code/:code', 'view:unit', async (req, res) => {
      const { code } = cylinderCodeParamSchema.parse(req.params);
      res.json({ cylinder: await getCylinderByCode(ctx, code) });
    }),
    route('get', '/api/cylinders/:id', 'view:unit', async (req, res) => {
      const { id } = cylinderIdParamSchema.parse(req.params);
      res.json(await getCylinder(ctx, id));
    }),
    route('post', '/api/cylinders/:id/weighings', 'record:event', async (req, res) => {
      const { id } = cylinderIdParamSchema.parse(req.params);
      res.status(201).json(await addWeighing(ctx, req.user!, id, weighingSchema.parse(req.body)));
    }),
    route('post', '/api/cylinders/:id/status', 'manage:units', async (req, res) => {
      const { id } = cylinderIdParamSchema.parse(req.params);
      res.json(await changeStatus(ctx, req.user!, id, cylinderStatusChangeSchema.parse(req.body)));
    }),
    route('get', '/api/cylinders/:id/label', 'manage:units', async (req, res) => {
      const { id } = cylinderIdParamSchema.parse(req.params);
      const [c] = await ctx.db.select().from(cylinders).where(eq(cylinders.id, id));
      if (!c) throw notFound('No such cylinder.');
      const pdf = await renderCylinderLabel({
        code: c.code,
        kind: c.kind,
        refrigerant: c.refrigerant,
        tareKg: c.tareKg,
        capacityKg: c.capacityKg,
        url: cylinderLabelUrl(ctx.publicUrl, c.code),
      });
      sendPdf(res, pdf, `tightloop-cylinder-${c.code}.pdf`);
    }),
    route('get', '/api/cylinder-imports/template', 'manage:units', async (_req, res) => {
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', 'attachment; filename="tightloop-cylinders-template.csv"');
      res.send(cylinderTemplateCsv());
    }),
    route(
      'post',
      '/api/cylinder-imports',
      'manage:units',
      async (req, res) => {
        res.status(201).json(await importCylinders(ctx, req.user!, requireCsvFile(req.file)));
      },
      [upload],
    ),
  ];
}
