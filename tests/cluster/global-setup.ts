// Starts the local cluster for the cluster tests when it is not running, and stops it afterwards only then.
import { runningParts, startCluster, stopCluster } from '../../scripts/cluster/cluster';

export default async function setup() {
  const startedHere = runningParts().length === 0;
  const log = (s: string) => console.info(`[cluster] ${s}`);
  await startCluster({ apis: 2, log });
  return async () => {
    if (startedHere) await stopCluster(log);
  };
}
