import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { count, like } from 'drizzle-orm';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { createApp } from '../../server/app';
import { createHttpServer } from '../../server/lib/http-server';
import { MAX_IMPORT_BYTES } from '../../shared/schemas/imports';
import { units } from '../../server/db/schema';
import { newToken } from '../../server/lib/ids';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { createTestSite, halyardNumber, withWrongCheckDigit } from '../support/units';

const { db, pool } = openTestDb();
const { app } = createApp({ db, rateLimits: { signInPerIp: 1000 } });
let engineer: TestAgent;
let technician: TestAgent;
let siteCode: string;

beforeAll(async () => {
  await resetDb(db);
  engineer = (await signInAs(app, db, 'engineer')).agent;
  technician = (await signInAs(app, db, 'technician')).agent;
  siteCode = (await createTestSite(db, { code: 'IMP-DEPOT' })).code;
});
afterAll(() => pool.end());

const HEADER = 'container_number,refrigerant,nominal_charge_kg,commissioned_on,site_code,status';
const IMPORT_HEADER_ALL = `${HEADER},machinery_serial,model,manufacture_year,purchase_cost,residual_value,notes`;
const fleetCsv = (from: number, n: number, edit?: (i: number, line: string) => string) => {
  const lines = [HEADER];
  for (let i = 0; i < n; i++) {
    const line = `${halyardNumber(from + i)},R-134a,4.5,2022-01-0${(i % 9) + 1},IMP-DEPOT,in_service`;
    lines.push(edit ? edit(i, line) : line);
  }
  return `${lines.join('\n')}\n`;
};

const unitsWithPrefix = async (prefix: string) =>
  Number(
    (
      await db
        .select({ n: count() })
        .from(units)
        .where(like(units.containerNumber, `${prefix}%`))
    )[0].n,
  );

function preview(agent: TestAgent, csv: string | Buffer, name = 'fleet.csv', fields: Record<string, string> = {}) {
  const req = agent.post('/api/unit-imports/preview').set('Origin', TEST_ORIGIN);
  for (const [k, v] of Object.entries(fields)) req.field(k, v);
  return req.attach('file', Buffer.from(csv), {
    filename: name,
    contentType: name.endsWith('.csv') ? 'text/csv' : 'application/octet-stream',
  });
}

function commit(agent: TestAgent, csv: string | Buffer, fields: Record<string, string> = {}, name = 'fleet.csv') {
  const req = agent
    .post('/api/unit-imports')
    .set('Origin', TEST_ORIGIN)
    .field('importKey', fields.importKey ?? newToken());
  for (const [k, v] of Object.entries(fields)) if (k !== 'importKey') req.field(k, v);
  return req.attach('file', Buffer.from(csv), { filename: name, contentType: 'text/csv' });
}

describe('fleet import: template and preview', () => {
  it('offers a template whose example rows import cleanly', async () => {
    const res = await engineer.get('/api/unit-imports/template');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('text/csv');
    const lines = res.text.trim().split('\n');
    expect(lines[0]).toBe(
      'container_number,refrigerant,nominal_charge_kg,commissioned_on,site_code,status,machinery_serial,model,manufacture_year,purchase_cost,residual_value,notes',
    );
    const checked = await preview(engineer, res.text, 'template.csv');
    expect(checked.status).toBe(200);
    expect(checked.body.preview).toMatchObject({ totalRows: 2, errorCount: 0, readyCount: 2 });
  });

  it('previews the first rows with per-row errors naming row, column and problem', async () => {
    const csv = fleetCsv(300000, 30, (i, line) => {
      if (i === 1) return line.replace(/^HRLU\d{7}/, withWrongCheckDigit(halyardNumber(300001)).number);
      if (i === 2) return line.replace('R-134a', 'R-22').replace(',4.5,', ',-1,').replace('IMP-DEPOT', 'NOWHERE-2');
      if (i === 3) return line.replace('IMP-DEPOT', 'NOWHERE');
      if (i === 4) return `${halyardNumber(300000)},R-134a,4.5,,,`;
      return line;
    });
    const res = await preview(engineer, csv);
    expect(res.status).toBe(200);
    const p = res.body.preview;
    expect(p).toMatchObject({
      fileName: 'fleet.csv',
      totalRows: 30,
      rowsWithErrors: 4,
      readyCount: 26,
      existingCount: 0,
    });
    expect(p.columns).toEqual(HEADER.split(','));
    expect(p.mapping).toMatchObject({ containerNumber: 'container_number', siteCode: 'site_code' });
    expect(p.sample).toHaveLength(10);
    expect(p.sample[0]).toMatchObject({
      row: 2,
      values: { containerNumber: halyardNumber(300000), refrigerant: 'R-134a' },
      errors: [],
    });
    const at = (row: number) => p.errors.filter((e: { row: number }) => e.row === row);
    expect(at(3)).toEqual([
      expect.objectContaining({
        column: 'container_number',
        field: 'containerNumber',
        message: expect.stringContaining(`gives ${halyardNumber(300001).charAt(10)}`),
      }),
    ]);
    expect(
      at(4)
        .map((e: { column: string }) => e.column)
        .sort(),
    ).toEqual(['nominal_charge_kg', 'refrigerant', 'site_code']);
    expect(at(5)).toEqual([
      expect.objectContaining({ column: 'site_code', message: expect.stringContaining('NOWHERE') }),
    ]);
    expect(at(6)).toEqual([
      expect.objectContaining({ column: 'container_number', message: expect.stringContaining('also on row 2') }),
    ]);
  });

  it('maps columns the file names its own way, with semicolons and decimal commas', async () => {
    const csv = `Unit;Gas;Charge;Depot\n${halyardNumber(310000)};R-513A;5,2;IMP-DEPOT\n`;
    const auto = await preview(engineer, csv);
    expect(auto.status).toBe(200);
    expect(auto.body.preview.mapping).toEqual({
      containerNumber: 'Unit',
      refrigerant: 'Gas',
      nominalChargeKg: 'Charge',
      siteCode: 'Depot',
    });
    expect(auto.body.preview.errorCount).toBe(0);
    const chosen = await preview(engineer, csv, 'fleet.csv', {
      mapping: JSON.stringify({ containerNumber: 'Unit', refrigerant: 'Gas', nominalChargeKg: 'Depot' }),
    });
    expect(chosen.body.preview.errors[0]).toMatchObject({ row: 2, column: 'Depot', field: 'nominalChargeKg' });
  });

  it('answers 400 when a required field has no column, or the mapping names a column the file lacks', async () => {
    const res = await preview(engineer, `container_number,refrigerant\n${halyardNumber(320000)},R-134a\n`);
    expect(res.status).toBe(400);
    expect(res.body.error.fields['mapping.nominalChargeKg']).toBeTruthy();
    const wrong = await preview(engineer, fleetCsv(320000, 1), 'fleet.csv', {
      mapping: JSON.stringify({
        containerNumber: 'nope',
        refrigerant: 'refrigerant',
        nominalChargeKg: 'nominal_charge_kg',
      }),
    });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields['mapping.containerNumber']).toContain('nope');
    const badJson = await preview(engineer, fleetCsv(320000, 1), 'fleet.csv', { mapping: '{' });
    expect(badJson.status).toBe(400);
  });

  it('refuses what is not CSV with a clear message', async () => {
    const byName = await preview(engineer, 'a,b\n1,2\n', 'fleet.xlsx');
    expect(byName.status).toBe(415);
    expect(byName.body.error.message).toContain('not a CSV file');
    const workbook = await preview(
      engineer,
      Buffer.concat([Buffer.from('PK\u0003\u0004'), Buffer.alloc(200, 1)]),
      'fleet.csv',
    );
    expect(workbook.status).toBe(415);
    expect(workbook.body.error.message).toContain('spreadsheet workbook');
    const binary = await preview(engineer, Buffer.from([0x41, 0x00, 0x42, 0x0a]), 'fleet.csv');
    expect(binary.status).toBe(415);
  });

  it('answers 400 for no file, an empty file or only a header, and 413 for a file over the limit', async () => {
    const none = await engineer.post('/api/unit-imports/preview').set('Origin', TEST_ORIGIN).field('mapping', '{}');
    expect(none.status).toBe(400);
    expect(none.body.error.fields.file).toBeTruthy();
    expect((await preview(engineer, '')).status).toBe(400);
    expect((await preview(engineer, `${HEADER}\n`)).body.error.message).toContain('no units');
    const huge = await preview(engineer, Buffer.alloc(26 * 1024 * 1024, 'a'));
    expect(huge.status).toBe(413);
  });

  it('reports rows that are already registered', async () => {
    const existing = await createTestUnit(db, { containerNumber: halyardNumber(330001) });
    const res = await preview(engineer, fleetCsv(330000, 3));
    expect(res.body.preview).toMatchObject({ existingCount: 1, readyCount: 2, errorCount: 0 });
    expect(res.body.preview.existing).toEqual([
      { row: 3, containerNumber: existing.containerNumber, unitId: existing.id },
    ]);
  });
});

describe('fleet import: commit', () => {
  it('imports every row and reports progress as committed', async () => {
    const importKey = newToken();
    const res = await commit(engineer, fleetCsv(400000, 250), { importKey });
    expect(res.status).toBe(201);
    expect(res.body.import).toMatchObject({
      key: importKey,
      status: 'committed',
      totalRows: 250,
      processedRows: 250,
      insertedRows: 250,
    });
    expect(await unitsWithPrefix('HRLU400')).toBe(250);
    const progress = await engineer.get(`/api/unit-imports/${importKey}`);
    expect(progress.body.import).toMatchObject({ status: 'committed', insertedRows: 250 });
    const listed = await technician.get('/api/units').query({ q: 'HRLU4000', siteId: undefined });
    expect(listed.body.units[0]).toMatchObject({
      containerNumber: halyardNumber(400000),
      site: { code: siteCode },
      status: 'in_service',
    });
  });

  it('leaves the table unchanged when one row of 10,000 is bad', async () => {
    const before = Number((await db.select({ n: count() }).from(units))[0].n);
    const csv = fleetCsv(500000, 10_000, (i, line) => (i === 7_777 ? line.replace(',4.5,', ',lots,') : line));
    const importKey = newToken();
    const res = await commit(engineer, csv, { importKey });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toContain('1 of 10000 rows need fixing; nothing was imported');
    expect(res.body.error.fields).toEqual({ 'rows.7779.nominalChargeKg': expect.any(String) });
    expect(Number((await db.select({ n: count() }).from(units))[0].n)).toBe(before);
    expect((await engineer.get(`/api/unit-imports/${importKey}`)).body.import.status).toBe('failed');
  });

  it('refuses duplicates of registered units with 409 unless told to skip them', async () => {
    await createTestUnit(db, { containerNumber: halyardNumber(600002) });
    const refused = await commit(engineer, fleetCsv(600000, 5));
    expect(refused.status).toBe(409);
    expect(refused.body.error.fields).toEqual({ 'rows.4.containerNumber': 'Already registered' });
    expect(await unitsWithPrefix('HRLU600')).toBe(1);
    const skipped = await commit(engineer, fleetCsv(600000, 5), { skipExisting: 'true' });
    expect(skipped.status).toBe(201);
    expect(skipped.body.import).toMatchObject({ totalRows: 5, insertedRows: 4 });
    expect(await unitsWithPrefix('HRLU600')).toBe(5);
  });

  it('answers 409 for an import key used before and 400 for a missing one', async () => {
    const importKey = newToken();
    expect((await commit(engineer, fleetCsv(610000, 1), { importKey })).status).toBe(201);
    expect((await commit(engineer, fleetCsv(610100, 1), { importKey })).status).toBe(409);
    const noKey = await engineer
      .post('/api/unit-imports')
      .set('Origin', TEST_ORIGIN)
      .attach('file', Buffer.from(fleetCsv(610200, 1)), 'fleet.csv');
    expect(noKey.status).toBe(400);
    expect(noKey.body.error.fields.importKey).toBeTruthy();
  });

  it('answers 404 for the progress of an unknown import', async () => {
    expect((await engineer.get('/api/unit-imports/no-such-import')).status).toBe(404);
  });

  it('is for those who manage units: 403 for a technician, 401 without a session', async () => {
    expect((await commit(technician, fleetCsv(620000, 1))).status).toBe(403);
    expect((await preview(technician, fleetCsv(620000, 1))).status).toBe(403);
    expect((await technician.get('/api/unit-imports/template')).status).toBe(403);
    const anon = await request(app)
      .post('/api/unit-imports')
      .set('Origin', TEST_ORIGIN)
      .attach('file', Buffer.from(fleetCsv(620000, 1)), 'fleet.csv');
    expect(anon.status).toBe(401);
    expect(await unitsWithPrefix('HRLU620')).toBe(0);
  });
});

describe('fleet import: a 25 MB file', () => {
  // A new connection each time: a reused one can be closed by the server's keep-alive timer in between.
  const getStatus = (url: string) =>
    new Promise<number | undefined>((resolve, reject) => {
      http.get(url, { agent: false }, (r) => resolve(r.resume().statusCode)).on('error', reject);
    });

  /** Asks for `url` every 10 ms until `until` settles; the slowest answer in ms and how many there were. */
  async function poll(url: string, until: Promise<unknown>) {
    let done = false;
    void until.finally(() => (done = true));
    let slowest = 0;
    let polls = 0;
    while (!done) {
      const started = performance.now();
      expect(await getStatus(url)).toBe(200);
      slowest = Math.max(slowest, performance.now() - started);
      polls += 1;
      await new Promise((r) => setTimeout(r, 10));
    }
    return { slowest, polls };
  }

  it(
    'keeps the API answering (health within 100 ms) while a 25 MB file is previewed',
    // A shared machine can stall the whole process for a few hundred ms on its own; a blocking parse fails every try.
    { timeout: 120_000, retry: 2 },
    async () => {
      // Every column filled: about 130 bytes a row, 190,000 rows, just under the 25 MB limit. Written straight into a
      // buffer, so this process (the server's too) holds no 25 MB string or 190,000 lines for its collector to walk.
      const csv = Buffer.alloc(MAX_IMPORT_BYTES);
      let size = csv.write(`${IMPORT_HEADER_ALL}\n`);
      for (let i = 0; i < 190_000; i++) {
        const cells = `${halyardNumber(700_000 + i)},R-134a,4.5,2021-03-15,IMP-DEPOT,in_service,MX-2021-${i}`;
        size += csv.write(`${cells},HX-40 Cold,2020,14800.00,3500.00,Door seals renewed after survey\n`, size);
      }
      expect(size).toBeGreaterThan(24 * 1024 * 1024);

      const server = createHttpServer(app);
      await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
      const health = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/health`;
      // The same polling with nothing else going on: on a busy shared machine health is slow by itself.
      const idle = await poll(health, new Promise((r) => setTimeout(r, 2000)));
      const started = performance.now();
      const previewing = Promise.resolve(preview(engineer, csv.subarray(0, size)));
      const during = await poll(health, previewing);
      const res = await previewing;
      const previewMs = performance.now() - started;
      server.close();
      console.info(
        `25 MB preview (${(size / 1024 / 1024).toFixed(1)} MB, 190,000 rows): ${Math.round(previewMs)} ms; ` +
          `slowest health answer ${Math.round(during.slowest)} ms of ${during.polls} (idle: ${Math.round(idle.slowest)} ms of ${idle.polls})`,
      );
      expect(res.status).toBe(200);
      expect(res.body.preview).toMatchObject({ totalRows: 190_000, errorCount: 0, readyCount: 190_000 });
      // Within 100 ms of what the machine gives an idle API (a few ms when it is not shared).
      expect(during.slowest).toBeLessThan(100 + idle.slowest);
    },
  );
});

// Timed on demand: IMPORT_BENCH=1 npx vitest run --project api tests/api/import.test.ts
describe.skipIf(!process.env.IMPORT_BENCH)('fleet import: 100,000 rows', () => {
  it('imports 100,000 rows in under a minute', { timeout: 120_000 }, async () => {
    const csv = fleetCsv(0, 100_000, (i, line) =>
      line.replace(/^HRLU/, 'HBXU').replace(/^HBXU\d{7}/, halyardNumber(i, 'HBX')),
    );
    const started = Date.now();
    const res = await commit(engineer, csv);
    const seconds = (Date.now() - started) / 1000;
    console.info(`100,000-row import: ${seconds.toFixed(1)} s (${(csv.length / 1024 / 1024).toFixed(1)} MB)`);
    expect(res.status).toBe(201);
    expect(res.body.import.insertedRows).toBe(100_000);
    expect(seconds).toBeLessThan(60);
  });
});
