// `npm run cluster:stop`: stops every part of the local cluster; its data stays in .data/cluster/.
import { runningParts, stopCluster } from './cluster';

if (!runningParts().length) {
  console.log('The cluster is not running.');
} else {
  await stopCluster((s) => console.log(s));
  console.log('Stopped the cluster.');
}
