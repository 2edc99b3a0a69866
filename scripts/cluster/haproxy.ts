// HAProxy (Debian's) in front of everything: HTTP on the cluster's port to the API processes, and one MariaDB front
// through which every API process reaches the Galera node that takes the writes.
import { spawn } from 'node:child_process';
import { openSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { CLUSTER_DIR, HTTP_PORT, logFile, MAX_API, NODES, PORTS } from './layout';

export const HAPROXY = '/usr/sbin/haproxy';

export function haproxyConfig(apis: number): string {
  const api = Array.from({ length: MAX_API }, (_, k) => k + 1)
    .map(
      (i) =>
        // API processes beyond the requested count are listed but disabled, so the benchmark can add them at run time.
        `  server api${i} 127.0.0.1:${PORTS.api(i)} check inter 1s fall 2 rise 2${i > apis ? ' disabled' : ''}`,
    )
    .join('\n');
  const db = NODES.map(
    (i) =>
      `  server node${i} 127.0.0.1:${PORTS.node(i)} check inter 1s fall 2 rise 3 agent-check agent-port ${PORTS.agent(i)} agent-inter 1s on-marked-down shutdown-sessions${i > 1 ? ' backup' : ''}`,
  ).join('\n');
  return `# Written by scripts/cluster/haproxy.ts for the local cluster; edits are overwritten.
global
  maxconn 2000
  stats socket ${path.join(CLUSTER_DIR, 'haproxy.sock')} mode 600 level admin

defaults
  timeout connect 2s
  timeout client 120s
  timeout server 120s
  retries 2
  # A request whose connection to an API process or node could not be made goes to another one.
  option redispatch

frontend http
  mode http
  bind 127.0.0.1:${HTTP_PORT}
  option forwardfor
  default_backend api

backend api
  mode http
  balance roundrobin
  option httpchk GET /api/health
  http-check expect status 200
  # Only a request that never reached a process is sent to another: a write that reached one is the client's to
  # send again (with its submission key).
  retry-on conn-failure
${api}

listen mariadb
  mode tcp
  bind 127.0.0.1:${PORTS.db}
  timeout client 1h
  timeout server 1h
  # One node takes every connection (the others are backups) and keeps it after a failover: writes never meet on
  # two nodes, so they queue on the unit's row lock instead of failing certification (decision record 012).
  stick-table type ip size 1
  stick on dst
${db}

listen stats
  mode http
  bind 127.0.0.1:${PORTS.haproxyStats}
  stats enable
  stats uri /
`;
}

export function startHaproxy(apis: number): number {
  const cfg = path.join(CLUSTER_DIR, 'haproxy.cfg');
  writeFileSync(cfg, haproxyConfig(apis));
  const out = openSync(logFile('haproxy'), 'a');
  // -db: stay in the foreground (this detached child is the process to stop); -W: master-worker, so a reload works.
  const child = spawn(HAPROXY, ['-W', '-db', '-f', cfg], { detached: true, stdio: ['ignore', out, out] });
  child.unref();
  return child.pid ?? 0;
}
