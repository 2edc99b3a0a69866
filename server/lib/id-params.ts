// Route parameters that name a row by its numeric id. A malformed id is a 400 naming `id`, never a 500.
import { z } from 'zod';

const MAX_INT = 2_147_483_647;

export const unitIdParam = z.object({
  id: z.coerce.number({ message: 'Not a valid unit id' }).int().positive().max(MAX_INT),
});

export const jobIdParam = z.object({
  id: z.coerce.number({ message: 'Not a valid job id' }).int().positive().max(MAX_INT),
});

/** Entries and attachments. */
export const numericIdParam = z.object({ id: z.coerce.number().int().positive({ message: 'Not a valid id' }) });
