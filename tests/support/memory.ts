// What a piece of work holds in memory at once: heap and buffers, read after a full collection, so garbage waiting for
// the collector does not count. The process's RSS counts it, and a streaming test measured that way failed at random.
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

setFlagsFromString('--expose-gc');
const collectGarbage = runInNewContext('gc') as () => void;

function liveBytes(): number {
  collectGarbage();
  const m = process.memoryUsage();
  return m.heapUsed + m.arrayBuffers;
}

/**
 * The most `work` held at once over what was held before it began, read every `everyMs` (each reading collects first,
 * which costs more the more the process holds: long work is read less often).
 */
export async function peakHeldBytes(work: () => Promise<void>, everyMs = 25): Promise<number> {
  const before = liveBytes();
  let peak = before;
  const sampler = setInterval(() => (peak = Math.max(peak, liveBytes())), everyMs);
  try {
    await work();
  } finally {
    clearInterval(sampler);
  }
  return peak - before;
}
