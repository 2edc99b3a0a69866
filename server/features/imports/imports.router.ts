import {
  importCommitFormSchema,
  importKeyParamSchema,
  importPreviewFormSchema,
  MAX_IMPORT_BYTES,
} from '../../../shared/schemas/imports';
import type { AppContext } from '../../lib/app-context';
import { csvUpload, requireCsvFile } from '../../middleware/upload';
import { route } from '../../lib/route';
import { commitImport, getImport, importTemplateCsv, previewImport } from './imports.service';

export function importsRoutes(ctx: AppContext) {
  // Streamed to a temporary file and parsed from there; removed again when the response is sent.
  const upload = csvUpload(ctx.storage.tempDir, MAX_IMPORT_BYTES);
  return [
    route('get', '/api/unit-imports/template', 'manage:units', async (_req, res) => {
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', 'attachment; filename="tightloop-fleet-template.csv"');
      res.send(await importTemplateCsv(ctx.db));
    }),
    route(
      'post',
      '/api/unit-imports/preview',
      'manage:units',
      async (req, res) => {
        const file = requireCsvFile(req.file);
        const { mapping } = importPreviewFormSchema.parse(req.body ?? {});
        res.json({ preview: await previewImport(ctx.db, file, mapping) });
      },
      [upload],
    ),
    route(
      'post',
      '/api/unit-imports',
      'manage:units',
      async (req, res) => {
        const file = requireCsvFile(req.file);
        const form = importCommitFormSchema.parse(req.body ?? {});
        const result = await commitImport(ctx, req.user!.id, file, form);
        res.status(201).json({ import: result });
      },
      [upload],
    ),
    route('get', '/api/unit-imports/:key', 'manage:units', async (req, res) => {
      const { key } = importKeyParamSchema.parse(req.params);
      res.json({ import: await getImport(ctx.db, key) });
    }),
  ];
}
