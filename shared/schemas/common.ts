import { z } from 'zod';

// The one error shape every API failure uses.
export const apiErrorDto = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
});
export type ApiErrorDto = z.infer<typeof apiErrorDto>;

export const idParamSchema = z.object({ id: z.string().min(1).max(64) });
