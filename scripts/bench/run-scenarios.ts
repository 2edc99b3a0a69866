// The scenarios, each measured saturated and at the steady rate, `--repeat` times, beside the baseline measured in the
// same rounds (the ratio of the two is what the baseline share target reads).
import mysql from 'mysql2/promise';
import type { BenchContext } from './context';
import { fmtRun, measure, measureSteady, settle, type Run } from './measure';
import { get, type Scenario } from './scenarios';

export type ScenarioRuns = {
  /** Runs by scenario id, and the baseline's under 'baseline'. */
  runs: Record<string, Run[]>;
  steadyRuns: Record<string, Run[]>;
  /** Each saturated run's req/s over the baseline's of the same round. */
  ratios: Record<string, number[]>;
  /** The probe's status by scenario id (200 for writes, which have no probe); 404 means not measured. */
  available: Map<string, number>;
};

export async function runScenarios(ctx: BenchContext, selected: Scenario[]): Promise<ScenarioRuns> {
  const { options, servers, dataset, rng } = ctx;
  const { appUrl, baselineUrl, appHeaders } = servers;
  const { durationS, repeat, steadyRate, connections } = options;
  const available = new Map<string, number>();
  for (const s of selected) {
    if (!s.probe) {
      available.set(s.id, 200);
      continue;
    }
    const res = await fetch(`${appUrl}${s.probe}`, { headers: appHeaders });
    await res.arrayBuffer();
    available.set(s.id, res.status);
  }
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(rng.next() * xs.length)];
  const baselineRequests = get(() => `/units/${pick(dataset.unitIds)}`);
  await waitForRepairJob(ctx.databaseUrl);

  // Every scenario once before measuring: JIT, pools, buffer pool, and first-request work (the fleet routes check
  // for units without statistics on their first read in a process) stay out of the figures.
  const warmS = Math.min(3, durationS);
  console.log(`Warming up (${warmS} s per scenario)…`);
  await measure(baselineUrl, baselineRequests, warmS, {}, connections);
  for (const s of selected) {
    if (available.get(s.id) === 404) continue;
    await settle(appUrl);
    await measure(appUrl, s.requests(), warmS, appHeaders, s.connections ?? connections);
  }

  const runs: Record<string, Run[]> = { baseline: [] };
  const steadyRuns: Record<string, Run[]> = { baseline: [] };
  for (const s of selected) {
    runs[s.id] = [];
    steadyRuns[s.id] = [];
  }
  const ratios: Record<string, number[]> = {};
  for (let r = 1; r <= repeat; r++) {
    await settle(appUrl);
    const base = await measure(baselineUrl, baselineRequests, durationS, {}, connections);
    runs.baseline.push(base);
    console.log(`run ${r}/${repeat}  baseline                ${fmtRun(base)}`);
    await settle(appUrl);
    const steadyBase = await measureSteady(baselineUrl, baselineRequests, durationS, steadyRate, {}, connections);
    steadyRuns.baseline.push(steadyBase);
    console.log(`run ${r}/${repeat}  baseline   @${steadyRate}/s     ${fmtRun(steadyBase)}`);
    for (const s of selected) {
      const status = available.get(s.id)!;
      if (status === 404) continue;
      await settle(appUrl);
      const run = await measure(appUrl, s.requests(), durationS, appHeaders, s.connections ?? connections);
      runs[s.id].push(run);
      (ratios[s.id] ??= []).push(run.rps / base.rps);
      console.log(`run ${r}/${repeat}  ${s.id.padEnd(22)}  ${fmtRun(run)}`);
      await settle(appUrl);
      const steady = await measureSteady(appUrl, s.requests(), durationS, steadyRate, appHeaders, connections);
      steadyRuns[s.id].push(steady);
      console.log(`run ${r}/${repeat}  ${`${s.id} @${steadyRate}/s`.padEnd(22)}  ${fmtRun(steady)}`);
    }
  }
  return { runs, steadyRuns, ratios, available };
}

/** The first overview read starts the repair-effectiveness rebuild in the app (a background job): let it finish. */
async function waitForRepairJob(databaseUrl: string) {
  const jobs = await mysql.createConnection({ uri: databaseUrl, timezone: 'Z' });
  const t = Date.now();
  for (;;) {
    const [rows] = (await jobs.query(
      "SELECT status FROM background_jobs WHERE kind = 'repair_effectiveness' ORDER BY id DESC LIMIT 1",
    )) as unknown as [{ status: string }[]];
    if (rows[0]?.status !== 'running') break;
    if (Date.now() - t > 600_000) throw new Error('The repair-effectiveness job did not finish in 10 minutes.');
    await new Promise((r) => setTimeout(r, 1000));
  }
  if (Date.now() - t > 1500)
    console.log(`Waited ${((Date.now() - t) / 1000).toFixed(0)} s for the app's repair-effectiveness job.`);
  await jobs.end();
}
