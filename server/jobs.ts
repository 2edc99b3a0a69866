// Which feature does each kind of background job (the runner in server/lib/jobs/ knows them only by kind).
import type { Db } from './db/client';
import { createCaches } from './lib/caches';
import type { Clock } from './lib/clock';
import { createJobRunner, type JobContext, type JobDefinition, type JobKind } from './lib/jobs/runner';
import type { Logger } from './lib/logger';
import { repairEffectivenessJob } from './features/fleet/repair-effectiveness.job';
import { forecastCasesJob } from './features/forecast/forecast-cases.job';
import { statsRecomputeJob } from './features/history/stats-recompute.job';

export const JOB_DEFINITIONS: Record<JobKind, JobDefinition> = {
  stats_recompute: statsRecomputeJob,
  repair_effectiveness: repairEffectivenessJob,
  forecast_cases: forecastCasesJob,
};

/** A job context outside the API (scripts, the demo fleet): its own caches and runner. */
export function standaloneJobContext(base: { db: Db; clock: Clock; logger: Logger; publicUrl: string }): JobContext {
  const ctx: JobContext = { ...base, caches: createCaches(), jobs: createJobRunner(() => ctx, JOB_DEFINITIONS) };
  return ctx;
}

/** Rebuilds the repair-effectiveness table now, with the job the server runs, and waits for it. */
export async function rebuildRepairEffectiveness(base: Parameters<typeof standaloneJobContext>[0]): Promise<void> {
  const ctx = standaloneJobContext(base);
  await ctx.jobs.start('repair_effectiveness');
  await ctx.jobs.waitForAll();
}
