// Rebuilds the fleet pre-aggregates (visit_made_up, fleet_monthly) from the history, and the repair-effectiveness
// table. For histories loaded without the API (the demo fleet simulator, a migration from another system).
// Usage: DATABASE_URL=… npx tsx scripts/rebuild-fleet-aggregates.ts
import { createDb } from '../server/db/client';
import { rebuildFleetMonthly } from '../server/lib/record/monthly-totals';
import { rebuildRepairEffectiveness } from '../server/jobs';
import { createLogger } from '../server/lib/logger';
import { systemClock } from '../server/lib/clock';
import { resolveDatabaseUrl } from './lib/database-url';
import { publicUrl, readEnv } from '../server/env';

const { db, pool } = createDb(await resolveDatabaseUrl(), { connectionLimit: 4 });
const t0 = Date.now();
await rebuildFleetMonthly(db, { onProgress: (v) => process.stdout.write(`\rvisits up to ${v}`) });
console.log(`\nfleet_monthly rebuilt in ${((Date.now() - t0) / 1000).toFixed(1)} s`);
const t1 = Date.now();
await rebuildRepairEffectiveness({
  db,
  clock: systemClock,
  logger: createLogger('warn'),
  publicUrl: publicUrl(readEnv()),
});
console.log(`repair effectiveness rebuilt in ${((Date.now() - t1) / 1000).toFixed(1)} s`);
await pool.end();
