// `npm run cluster [-- --api N]`: three Galera nodes, N API processes (2 by default, at most 3), HAProxy on the
// cluster port and the fake S3/SMTP services, all on loopback; `npm run cluster:stop` stops them.
import { parseArgs } from 'node:util';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../seed/demo-accounts';
import { startCluster } from './cluster';
import { CLUSTER_DIR, clusterUrl, NODES, PORTS } from './layout';

const { values } = parseArgs({ options: { api: { type: 'string', default: '2' } } });
const t0 = Date.now();
const log = (s: string) => console.log(`[${((Date.now() - t0) / 1000).toFixed(1)} s] ${s}`);

const state = await startCluster({ apis: Number(values.api), buildClient: true, log });
log(`Tightloop cluster is running at ${clusterUrl()}`);
console.log(`
  Galera nodes     ${NODES.map((i) => `127.0.0.1:${PORTS.node(i)}`).join(', ')} (data in ${CLUSTER_DIR})
  MariaDB front    127.0.0.1:${PORTS.db} (HAProxy: one node takes the connections, the others stand by)
  API processes    ${Array.from({ length: state.apis }, (_, k) => `127.0.0.1:${PORTS.api(k + 1)}`).join(', ')}
  fake S3          http://127.0.0.1:${PORTS.s3}
  HAProxy stats    http://127.0.0.1:${PORTS.haproxyStats}/
  logs             ${CLUSTER_DIR}/logs

Demo sign-ins (password "${DEMO_PASSWORD}"): ${DEMO_ACCOUNTS.map((a) => a.email).join(', ')}
Stop it with \`npm run cluster:stop\`.`);
