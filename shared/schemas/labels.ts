// Label codes: the QR token on a unit's label, and label sheets.
import { z } from 'zod';

export const MAX_LABELS_PER_SHEET_REQUEST = 500;

export const qrTokenParamSchema = z.object({
  token: z.string().regex(/^[A-Za-z0-9_-]{16,64}$/, 'This is not a Tightloop label code'),
});

export const labelsRequestSchema = z.object({
  unitIds: z
    .array(z.number().int().positive())
    .min(1, 'Choose at least one unit')
    .max(MAX_LABELS_PER_SHEET_REQUEST, `Print at most ${MAX_LABELS_PER_SHEET_REQUEST} labels at a time`),
});
export type LabelsRequest = z.infer<typeof labelsRequestSchema>;
