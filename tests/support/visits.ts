// Service histories for the fleet tests, recorded through POST /api/visits so the statistics are the real ones.
import { randomUUID } from 'node:crypto';
import { expect } from 'vitest';
import type TestAgent from 'supertest/lib/agent';
import { TEST_ORIGIN } from './factories';

export type VisitScript = { at: string; siteId?: number; events: Record<string, unknown>[] }[];

/** Records each visit in turn and returns the created event ids, visit by visit. */
export async function recordVisits(agent: TestAgent, unitId: number, script: VisitScript): Promise<number[][]> {
  const ids: number[][] = [];
  for (const v of script) {
    const res = await agent
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({ idempotencyKey: randomUUID(), unitId, siteId: v.siteId, occurredAt: v.at, events: v.events });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    ids.push(res.body.events.map((e: { id: number }) => e.id));
  }
  return ids;
}

/** A unit that leaks again and again at one service valve: three top-ups, a verified repair, two more. */
export function chronicLeaker(year = 2026): VisitScript {
  return [
    { at: `${year - 1}-07-05T10:00:00Z`, events: [{ kind: 'top_up', kg: 1.0, cylinder: 'CYL-A100' }] },
    { at: `${year - 1}-10-02T10:00:00Z`, events: [{ kind: 'top_up', kg: 1.1, cylinder: 'CYL-A101' }] },
    {
      at: `${year - 1}-12-12T10:00:00Z`,
      events: [
        { kind: 'leak_check', method: 'electronic_detector', leakFound: true, location: 'service_valve' },
        { kind: 'repair', location: 'service_valve', action: 'valve_core_replaced', verified: true },
        { kind: 'recovery', kg: 2.0, cylinder: 'REC-1' },
        { kind: 'recharge', kg: 4.5, cylinder: 'CYL-B200' },
      ],
    },
    {
      at: `${year}-03-01T10:00:00Z`,
      events: [
        { kind: 'leak_check', method: 'bubble_solution', leakFound: true, location: 'service_valve' },
        { kind: 'top_up', kg: 0.9, cylinder: 'CYL-B201' },
      ],
    },
    {
      at: `${year}-05-02T10:00:00Z`,
      events: [
        { kind: 'top_up', kg: 0.8, cylinder: 'CYL-B202' },
        // The leak found in March is still open: a PTI cannot pass (issue 23).
        { kind: 'pti', passed: false },
      ],
    },
  ];
}

/** A tight unit: a leak check that found nothing and a passed PTI. */
export function tightUnit(year = 2026): VisitScript {
  return [
    {
      at: `${year}-02-10T10:00:00Z`,
      events: [
        { kind: 'leak_check', method: 'electronic_detector', leakFound: false },
        { kind: 'pti', passed: true },
      ],
    },
  ];
}

/** Polls a job until it is no longer running. */
export async function waitForJob(agent: TestAgent, jobId: number, timeoutMs = 20_000) {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const res = await agent.get(`/api/jobs/${jobId}`);
    expect(res.status).toBe(200);
    if (res.body.job.status !== 'running')
      return res.body.job as { status: string; processed: number; total: number; message: string | null };
    if (Date.now() > until) throw new Error(`job ${jobId} still running: ${JSON.stringify(res.body.job)}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}
