import { parseContainerNumber } from '../../../shared/domain';
import {
  containerNumberParamSchema,
  createUnitSchema,
  unitIdParamSchema,
  unitListQuerySchema,
  updateUnitSchema,
} from '../../../shared/schemas/units';
import { qrTokenParamSchema } from '../../../shared/schemas/labels';
import type { AppContext } from '../../lib/app-context';
import { HttpError } from '../../lib/http-error';
import { route } from '../../lib/route';
import {
  createUnit,
  getUnit,
  getUnitByNumber,
  getUnitByToken,
  listUnitChanges,
  listUnits,
  reissueQrToken,
  updateUnit,
} from './units.service';

export function unitsRoutes(ctx: AppContext) {
  return [
    route('get', '/api/units', 'view:unit', async (req, res) => {
      const query = unitListQuerySchema.parse(req.query);
      res.json(await listUnits(ctx.db, query));
    }),
    route('get', '/api/units/by-token/:token', 'view:unit', async (req, res) => {
      const { token } = qrTokenParamSchema.parse(req.params);
      res.json({ unit: await getUnitByToken(ctx.db, token) });
    }),
    route('get', '/api/units/by-number/:number', 'view:unit', async (req, res) => {
      const { number } = containerNumberParamSchema.parse(req.params);
      const parsed = parseContainerNumber(number);
      if (!parsed.ok) {
        const code = parsed.expectedCheckDigit === undefined ? 'invalid_container_number' : 'check_digit_mismatch';
        throw new HttpError(400, code, parsed.error, { number: parsed.error });
      }
      res.json({ unit: await getUnitByNumber(ctx.db, parsed.value) });
    }),
    route('get', '/api/units/:id', 'view:unit', async (req, res) => {
      const { id } = unitIdParamSchema.parse(req.params);
      res.json({ unit: await getUnit(ctx.db, id) });
    }),
    route('get', '/api/units/:id/changes', 'view:unit', async (req, res) => {
      const { id } = unitIdParamSchema.parse(req.params);
      res.json({ changes: await listUnitChanges(ctx.db, id) });
    }),
    route('post', '/api/units', 'manage:units', async (req, res) => {
      const input = createUnitSchema.parse(req.body);
      res.status(201).json({ unit: await createUnit(ctx, req.user!.id, input) });
    }),
    route('patch', '/api/units/:id', 'manage:units', async (req, res) => {
      const { id } = unitIdParamSchema.parse(req.params);
      const input = updateUnitSchema.parse(req.body);
      res.json({ unit: await updateUnit(ctx, req.user!.id, id, input) });
    }),
    route('post', '/api/units/:id/qr-token', 'manage:units', async (req, res) => {
      const { id } = unitIdParamSchema.parse(req.params);
      res.json({ unit: await reissueQrToken(ctx.db, req.user!.id, ctx.clock.now(), id) });
    }),
  ];
}
