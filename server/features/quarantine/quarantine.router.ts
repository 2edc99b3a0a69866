import type { AppContext } from '../../lib/app-context';
import { unitIdParam } from '../../lib/id-params';
import { route } from '../../lib/route';
import { liftQuarantineSchema, quarantineUnitsSchema } from '../../../shared/schemas/quarantine';
import { liftQuarantine, quarantineUnits } from './quarantine.service';

export function quarantineRoutes(ctx: AppContext) {
  return [
    route('post', '/api/quarantine', 'manage:units', async (req, res) => {
      const input = quarantineUnitsSchema.parse(req.body);
      res.status(201).json(await quarantineUnits(ctx, req.user!, input));
    }),
    route('post', '/api/units/:id/quarantine/lift', 'lift:quarantine', async (req, res) => {
      const { id } = unitIdParam.parse(req.params);
      const input = liftQuarantineSchema.parse(req.body);
      const { replayed, ...result } = await liftQuarantine(ctx, req.user!, id, input);
      res.status(replayed ? 200 : 201).json(result);
    }),
  ];
}
