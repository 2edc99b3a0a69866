// HAProxy's readiness agent for the Galera nodes: one port per node; each time HAProxy connects it answers "up" only
// while that node is Synced in the primary component, else "down". A node that answers on its port but is still
// joining (receiving a state transfer) or has lost quorum gets no application traffic.
// Run: tsx scripts/cluster/galera-agent.ts (reads the check user's password from .data/cluster/state.json).
import net from 'node:net';
import mysql, { type Connection, type RowDataPacket } from 'mysql2/promise';
import { CHECK_USER, NODES, PORTS, readState } from './layout';

async function isReady(node: number, password: string, conns: Map<number, Connection>): Promise<boolean> {
  try {
    let conn = conns.get(node);
    if (!conn) {
      conn = await mysql.createConnection({
        host: '127.0.0.1',
        port: PORTS.node(node),
        user: CHECK_USER,
        password,
        connectTimeout: 1000,
      });
      conn.on('error', () => conns.delete(node));
      conns.set(node, conn);
    }
    const [rows] = await conn.query<RowDataPacket[]>(
      "SHOW GLOBAL STATUS WHERE Variable_name IN ('wsrep_local_state', 'wsrep_ready', 'wsrep_cluster_status')",
    );
    const s = Object.fromEntries(rows.map((r) => [r.Variable_name as string, String(r.Value)]));
    return s.wsrep_local_state === '4' && s.wsrep_ready === 'ON' && s.wsrep_cluster_status === 'Primary';
  } catch {
    const conn = conns.get(node);
    conns.delete(node);
    conn?.destroy();
    return false;
  }
}

const state = readState();
if (!state) throw new Error('No cluster state; start the cluster with npm run cluster.');
const conns = new Map<number, Connection>();
const servers = NODES.map((node) =>
  net
    .createServer((sock) => {
      sock.on('error', () => sock.destroy());
      void isReady(node, state.checkPassword, conns).then((up) => sock.end(up ? 'up\n' : 'down\n'));
    })
    .listen(PORTS.agent(node), '127.0.0.1'),
);
const stop = () => {
  for (const s of servers) s.close();
  for (const c of conns.values()) c.destroy();
  process.exit(0);
};
process.once('SIGTERM', stop);
process.once('SIGINT', stop);
