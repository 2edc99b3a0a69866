// What Galera asks of the application, checked on the running 3-node cluster: every table has a primary key and is
// InnoDB, no statement Galera refuses is used, certification failures come back as deadlocks that the write retry
// rule runs again, auto-increment values never collide between nodes, and a read on any node sees a write that
// another node acknowledged.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import type { Connection } from 'mysql2/promise';
import { isRetryableTransactionError } from '../../server/lib/db-errors';
import { retryTransaction } from '../../server/lib/retry';
import { DATABASE, NODES } from '../../scripts/cluster/layout';
import { PROJECT_ROOT } from '../../scripts/lib/mariadb';
import { connectNode, rows } from './support';

const PROBE = `${DATABASE}_probe`;
const conns: Connection[] = [];

beforeAll(async () => {
  for (const i of NODES) conns.push(await connectNode(i));
  await conns[0].query(`CREATE DATABASE IF NOT EXISTS \`${PROBE}\``);
  await conns[0].query(`DROP TABLE IF EXISTS \`${PROBE}\`.counters, \`${PROBE}\`.seq`);
  await conns[0].query(`CREATE TABLE \`${PROBE}\`.counters (id INT PRIMARY KEY, n INT NOT NULL) ENGINE=InnoDB`);
  await conns[0].query(
    `CREATE TABLE \`${PROBE}\`.seq (id INT AUTO_INCREMENT PRIMARY KEY, node INT NOT NULL) ENGINE=InnoDB`,
  );
  await conns[0].query(`INSERT INTO \`${PROBE}\`.counters VALUES (1, 0)`);
});
afterAll(async () => {
  await conns[0]?.query(`DROP DATABASE IF EXISTS \`${PROBE}\``);
  await Promise.all(conns.map((c) => c.end()));
});

function sourceFiles(dir: string): string[] {
  return readdirSync(path.join(PROJECT_ROOT, dir), { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile() && /\.(ts|sql)$/.test(e.name))
    .map((e) => path.join(e.parentPath, e.name));
}

describe('the schema and statements on Galera', () => {
  it('has a primary key on every table and only InnoDB tables', async () => {
    const bad = await rows(
      conns[0],
      `SELECT t.table_name AS name, t.engine AS engine FROM information_schema.tables t
       WHERE t.table_schema = ? AND (t.engine <> 'InnoDB' OR NOT EXISTS (
         SELECT 1 FROM information_schema.table_constraints c
         WHERE c.table_schema = t.table_schema AND c.table_name = t.table_name AND c.constraint_type = 'PRIMARY KEY'))`,
      [DATABASE],
    );
    expect(bad).toEqual([]);
    const [{ n }] = await rows<{ n: number }>(
      conns[0],
      'SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = ?',
      [DATABASE],
    );
    expect(Number(n)).toBeGreaterThan(20);
  });

  it('refuses a table without a primary key on the cluster (so a migration that adds one fails at once)', async () => {
    // wsrep_mode=REQUIRED_PRIMARY_KEY: MariaDB's words for it are "Galera replication not supported".
    await expect(conns[0].query(`CREATE TABLE \`${PROBE}\`.nokey (a INT) ENGINE=InnoDB`)).rejects.toThrow(
      /Galera replication not supported/,
    );
  });

  it('uses no statement Galera does not replicate (table locks, named locks, other engines)', () => {
    const banned = /\b(LOCK\s+TABLES?|GET_LOCK|RELEASE_LOCK|IS_FREE_LOCK|ENGINE\s*=\s*(MyISAM|Aria|MEMORY|CSV))\b/i;
    const offenders = ['server', 'drizzle', 'seed']
      .flatMap(sourceFiles)
      .filter((f) => banned.test(readFileSync(f, 'utf8')))
      .map((f) => path.relative(PROJECT_ROOT, f));
    expect(offenders).toEqual([]);
  });
});

describe('writes on two nodes at once', () => {
  it('reports a certification failure as a deadlock (1213), which the write retry rule runs again', async () => {
    const [a, b] = conns;
    const counter = `\`${PROBE}\`.counters`;
    let attempts = 0;
    let firstError: unknown = null;
    const result = await retryTransaction(async () => {
      attempts++;
      await a.query('START TRANSACTION');
      try {
        const [[{ n }]] = (await a.query(`SELECT n FROM ${counter} WHERE id = 1 FOR UPDATE`)) as unknown as [
          { n: number }[],
        ];
        // On the first attempt another node changes the same row and commits first: this node's commit then
        // fails certification. The row lock above is local to this node, so it does not stop the other writer.
        if (attempts === 1) await b.query(`UPDATE ${counter} SET n = n + 100 WHERE id = 1`);
        await a.query(`UPDATE ${counter} SET n = ? WHERE id = 1`, [n + 1]);
        await a.query('COMMIT');
        return n + 1;
      } catch (err) {
        firstError ??= err;
        await a.query('ROLLBACK').catch(() => undefined);
        throw err;
      }
    });
    expect(attempts).toBe(2);
    expect((firstError as { code?: string; errno?: number }).code).toBe('ER_LOCK_DEADLOCK');
    expect((firstError as { errno?: number }).errno).toBe(1213);
    expect(isRetryableTransactionError(firstError)).toBe(true);
    // The retried transaction read the other node's write: nothing was lost.
    expect(result).toBe(101);
    const [{ n }] = await rows<{ n: number }>(conns[2], `SELECT n FROM ${counter} WHERE id = 1`);
    expect(n).toBe(101);
  });

  it('hands out auto-increment values that never collide between nodes', async () => {
    const vars = await Promise.all(
      conns.map(
        async (c) =>
          (
            await rows<{ inc: number; off: number }>(
              c,
              'SELECT @@auto_increment_increment AS inc, @@auto_increment_offset AS off',
            )
          )[0],
      ),
    );
    expect(vars.map((v) => Number(v.inc))).toEqual([3, 3, 3]);
    expect(new Set(vars.map((v) => Number(v.off))).size).toBe(3);
    // 3 × 60 inserts side by side, one writer per node.
    await Promise.all(
      conns.map(async (c, k) => {
        for (let n = 0; n < 60; n++) await c.query(`INSERT INTO \`${PROBE}\`.seq (node) VALUES (?)`, [k + 1]);
      }),
    );
    const [{ total, ids }] = await rows<{ total: number; ids: number }>(
      conns[1],
      `SELECT COUNT(*) AS total, COUNT(DISTINCT id) AS ids FROM \`${PROBE}\`.seq`,
    );
    expect([Number(total), Number(ids)]).toEqual([180, 180]);
  });

  it('lets a read on any node see a write another node acknowledged (wsrep_sync_wait)', async () => {
    const [a, b, c] = conns;
    let missed = 0;
    for (let n = 1; n <= 200; n++) {
      await a.query(`UPDATE \`${PROBE}\`.counters SET n = ? WHERE id = 1`, [10_000 + n]);
      const [{ n: seen }] = await rows<{ n: number }>(
        n % 2 ? b : c,
        `SELECT n FROM \`${PROBE}\`.counters WHERE id = 1`,
      );
      if (seen !== 10_000 + n) missed++;
    }
    expect(missed).toBe(0);
  });
});
