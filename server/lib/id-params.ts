import { z } from 'zod';

export const unitIdParam = z.object({
  id: z.coerce.number({ message: 'Not a valid unit id' }).int().positive().max(2_147_483_647),
});
