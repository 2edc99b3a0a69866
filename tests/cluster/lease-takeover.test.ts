// The scheduled maintenance (stale jobs, the statistics backfill, old derived tables) runs in one API process of the
// cluster at a time, under a lease row; when that process is killed, its lease runs out and the other process takes
// the task over at its next tick.
import { describe, expect, it } from 'vitest';
import { apiPid, startApi, stopApi } from '../../scripts/cluster/cluster';
import { MAX_API } from '../../scripts/cluster/layout';
import { SCHEDULE_LEASES } from '../../server/scheduler';
import { connectNode, rows, sleep } from './support';

const MAINTENANCE_TICK_MS = 60_000;

async function holderPid(): Promise<number | null> {
  const conn = await connectNode(1);
  try {
    const [row] = await rows<{ holder: string; expired: number }>(
      conn,
      "SELECT holder, expires_at < UTC_TIMESTAMP(3) AS expired FROM leases WHERE name = 'maintenance'",
    );
    if (!row || Number(row.expired)) return null;
    return Number(row.holder.split(':').at(-2));
  } finally {
    await conn.end();
  }
}

/** Which API process (1–3) has this pid, if any. */
const apiOf = (pid: number | null) =>
  pid ? Array.from({ length: MAX_API }, (_, k) => k + 1).find((i) => apiPid(i) === pid) : undefined;
const LEASE_WAIT_MS = SCHEDULE_LEASES.maintenance + MAINTENANCE_TICK_MS + 20_000;

describe('the maintenance lease', () => {
  it(
    'is held by one API process and taken over by another once the holder is killed',
    { timeout: 2 * LEASE_WAIT_MS + 30_000 },
    async () => {
      // A process killed by an earlier test may hold it until it expires; the next tick then gives it to a live one.
      let holder = await holderPid();
      for (const since = Date.now(); !apiOf(holder) && Date.now() - since < LEASE_WAIT_MS;) {
        await sleep(2000);
        holder = await holderPid();
      }
      const first = apiOf(holder);
      expect(first, `lease holder pid ${holder} is one of the API processes`).toBeDefined();

      const killedAt = Date.now();
      await stopApi(first!, 'SIGKILL');
      let next: number | undefined;
      while (Date.now() - killedAt < LEASE_WAIT_MS) {
        next = apiOf(await holderPid());
        if (next && next !== first) break;
        await sleep(2000);
      }
      const tookS = Math.round((Date.now() - killedAt) / 1000);
      console.info(`maintenance lease: API process ${first} killed, API process ${next} took over after ${tookS} s`);
      await startApi(first!);
      expect(next).toBeDefined();
      expect(next).not.toBe(first);
    },
  );
});
