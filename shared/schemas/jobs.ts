// A background job's state and progress.
import { z } from 'zod';

export const JOB_KINDS = ['stats_recompute', 'repair_effectiveness', 'forecast_cases'] as const;
export const JOB_STATUSES = ['running', 'done', 'failed', 'superseded'] as const;

export const jobDto = z.object({
  id: z.number(),
  kind: z.enum(JOB_KINDS),
  status: z.enum(JOB_STATUSES),
  total: z.number(),
  processed: z.number(),
  message: z.string().nullable(),
  startedAt: z.string(),
  finishedAt: z.string().nullable(),
});
export type JobDto = z.infer<typeof jobDto>;

export const jobResponseDto = z.object({ job: jobDto });
export type JobResponseDto = z.infer<typeof jobResponseDto>;
