// The learned next top-up forecast (DOMAIN.md §7b): how its case base measured on the fleet's own record.
import { z } from 'zod';
import { FORECAST_SITUATIONS } from '../domain';

/** Accuracy of one situation (or of all): cases judged, those still open, MAE, 80 % range coverage, pinball loss. */
export const forecastAccuracyRowDto = z.object({
  situation: z.enum(FORECAST_SITUATIONS).nullable(),
  cases: z.number(),
  open: z.number(),
  maeDays: z.number().nullable(),
  coveragePct: z.number().nullable(),
  pinballDays: z.number().nullable(),
});
export type ForecastAccuracyRowDto = z.infer<typeof forecastAccuracyRowDto>;

export const forecastAccuracyDto = z.object({
  /** When the case base was learned and measured. */
  builtAt: z.string(),
  /** Past cut-offs with a known next top-up it learned from, and the units they came from. */
  cases: z.number(),
  units: z.number(),
  k: z.number(),
  all: forecastAccuracyRowDto,
  bySituation: z.array(forecastAccuracyRowDto),
});
export type ForecastAccuracyDto = z.infer<typeof forecastAccuracyDto>;
