import type { Response } from 'express';
import { labelsRequestSchema } from '../../../shared/schemas/labels';
import { unitIdParamSchema } from '../../../shared/schemas/units';
import type { AppContext } from '../../lib/app-context';
import { route } from '../../lib/route';
import { unitsForLabels } from './labels.service';
import { labelUrl, renderLabelSheet, renderSingleLabel, type LabelContent } from './label-sheet';

function sendPdf(res: Response, pdf: Uint8Array, fileName: string) {
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', `inline; filename="${fileName}"`);
  res.setHeader('Cache-Control', 'no-store');
  res.end(Buffer.from(pdf));
}

export function labelsRoutes(ctx: AppContext) {
  const contents = async (ids: number[]): Promise<LabelContent[]> =>
    (await unitsForLabels(ctx.db, ids)).map((u) => ({
      containerNumber: u.containerNumber,
      refrigerant: u.refrigerant,
      nominalChargeKg: Number(u.nominalChargeKg),
      url: labelUrl(ctx.publicUrl, u.qrToken),
    }));

  return [
    route('post', '/api/labels', 'manage:units', async (req, res) => {
      const { unitIds } = labelsRequestSchema.parse(req.body);
      const labels = await contents(unitIds);
      sendPdf(res, await renderLabelSheet(labels), `tightloop-labels-${labels.length}.pdf`);
    }),
    route('get', '/api/units/:id/label', 'manage:units', async (req, res) => {
      const { id } = unitIdParamSchema.parse(req.params);
      const [label] = await contents([id]);
      const layout = req.query.layout === 'sheet' ? 'sheet' : 'single';
      const pdf = layout === 'sheet' ? await renderLabelSheet([label]) : await renderSingleLabel(label);
      sendPdf(res, pdf, `tightloop-label-${label.containerNumber}.pdf`);
    }),
  ];
}
