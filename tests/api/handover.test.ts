// The handover pack: the JSON export with its checksum, and the PDF read back with a PDF text extractor.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash, randomUUID } from 'node:crypto';
import { mkdtempSync, writeFileSync, mkdirSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import sharp from 'sharp';
import canonicalize from 'canonicalize';
import { extractText, getDocumentProxy } from 'unpdf';
import { createApp } from '../../server/app';
import { createLocalStorage } from '../../server/lib/storage';
import { fmtPct } from '../../shared/format';
import {
  handoverFileLineDto,
  handoverLineDto,
  handoverProgressLineDto,
  type HandoverExport,
} from '../../shared/schemas/handover';
import type { UnitDecisionDto } from '../../shared/schemas/decisions';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { createTestSite, halyardNumber } from '../support/units';
import { chronicLeaker, recordVisits } from '../support/visits';

const { db, pool } = openTestDb();
const now = new Date('2026-06-01T12:00:00Z');
const storage = createLocalStorage(mkdtempSync(path.join(os.tmpdir(), 'tightloop-handover-')));
const { app } = createApp({ db, clock: { now: () => now }, storage, rateLimits: { signInPerIp: 1000 } });

type Agent = Awaited<ReturnType<typeof signInAs>>['agent'];
let owner: Agent;
let tech: Agent;
let unitId: number;
let allIds: number[];

/** Every text of the PDF, pages joined. */
async function pdfText(bytes: Buffer): Promise<{ text: string; pages: number }> {
  const pdf = await getDocumentProxy(new Uint8Array(bytes));
  const { text, totalPages } = await extractText(pdf, { mergePages: true });
  return { text: text.replace(/\s+/g, ' '), pages: totalPages };
}

const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

beforeAll(async () => {
  await resetDb(db);
  owner = (await signInAs(app, db, 'owner')).agent;
  tech = (await signInAs(app, db, 'technician')).agent;
  const site = await createTestSite(db, { name: 'South basin' });
  unitId = (await createTestUnit(db, { containerNumber: halyardNumber(630001), siteId: site.id })).id;
  const ids = await recordVisits(
    tech,
    unitId,
    chronicLeaker(2026).map((v) => ({ ...v, siteId: site.id })),
  );
  // A void, a photo and an owner's decision.
  const voided = ids[0][0];
  const v = await tech
    .post(`/api/events/${voided}/void`)
    .set('Origin', TEST_ORIGIN)
    .send({ reason: 'Typed on the wrong unit' });
  expect(v.status, JSON.stringify(v.body)).toBe(201);
  const png = await sharp({ create: { width: 320, height: 240, channels: 3, background: '#2a7' } })
    .png()
    .toBuffer();
  const up = await tech
    .post(`/api/events/${ids[2][1]}/attachments`)
    .set('Origin', TEST_ORIGIN)
    .attach('files', png, 'brazed-joint.png');
  expect(up.status, JSON.stringify(up.body)).toBe(201);
  const d = (await owner.get(`/api/decisions/units/${unitId}`)).body as UnitDecisionDto;
  const dec = await owner
    .post(`/api/decisions/units/${unitId}`)
    .set('Origin', TEST_ORIGIN)
    .send({
      choice: 'repair',
      economics: d.economics,
      inputs: { topUpIntervalDays: 60, madeUpKgPerVisit: 0.9, leakLocation: 'service_valve' },
      note: 'Repair at the next depot call',
      idempotencyKey: randomUUID(),
    });
  expect(dec.status, JSON.stringify(dec.body)).toBe(201);
  const json = (await owner.get(`/api/units/${unitId}/handover.json`)).body as HandoverExport;
  allIds = json.record.events.map((e) => e.id);
});
afterAll(() => pool.end());

describe('the handover JSON export', () => {
  it('holds every event, voids included, and a checksum anyone can recompute from the record', async () => {
    const res = await owner.get(`/api/units/${unitId}/handover.json`);
    expect(res.status).toBe(200);
    const x = res.body as HandoverExport;
    expect(x.format).toBe('tightloop-handover/1');
    expect(x.record.events.some((e) => e.kind === 'void')).toBe(true);
    expect(x.record.events.find((e) => e.voided)?.voided?.reason).toBe('Typed on the wrong unit');
    expect(x.record.events.find((e) => e.kind === 'decision')?.details).toMatchObject({ option: 'repair' });
    expect(x.record.events.flatMap((e) => e.attachments).map((a) => a.name)).toEqual(['brazed-joint.png']);
    const sha = createHash('sha256').update(canonicalize(x.record)!).digest('hex');
    expect(x.checksum).toBe(sha);
  });

  it('keeps only the events of a date range', async () => {
    const x = (await owner.get(`/api/units/${unitId}/handover.json?from=2026-01-01&to=2026-05-31`))
      .body as HandoverExport;
    expect(x.range).toEqual({ from: '2026-01-01', to: '2026-05-31' });
    expect(x.record.events.length).toBeGreaterThan(0);
    expect(x.record.events.every((e) => e.occurredAt >= '2026-01-01')).toBe(true);
    expect(x.record.events.length).toBeLessThan(allIds.length);
  });

  it('returns 400 for a range that ends before it starts, 404 for an unknown unit and 403 for a technician', async () => {
    const bad = await owner.get(`/api/units/${unitId}/handover.json?from=2026-05-01&to=2026-01-01`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.to).toBeTruthy();
    expect((await owner.get('/api/units/99999999/handover.json')).status).toBe(404);
    expect((await tech.get(`/api/units/${unitId}/handover.json`)).status).toBe(403);
  });
});

describe('the handover PDF', () => {
  it('contains every event of the unit and the checksum on its pages', async () => {
    const res = await owner.get(`/api/units/${unitId}/handover.pdf`).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const checksum = res.headers['x-record-checksum'] as string;
    const { text, pages } = await pdfText(res.body as Buffer);
    for (const id of allIds) expect(text).toContain(`#${id} `);
    expect(text.split(`Record checksum (SHA-256): ${checksum}`).length - 1).toBe(pages);
    expect(text).toContain('HRLU 630001');
    expect(text).toContain('VOIDED');
    expect(text).toContain('Typed on the wrong unit');
    expect(text).toContain('brazed-joint.png');
    expect(text).toMatch(/chose Repair/i);
    // Numbers by the screens' rule (shared/format.ts): "34 %", never "34.0 %"; kilograms to 10 g.
    const figures = ((await owner.get(`/api/units/${unitId}/handover.json`)).body as HandoverExport).record.figures!;
    expect(text).toContain(`${fmtPct(figures.rollingLeakRatePct)} of the full charge over 365 days`);
    expect(text).toMatch(
      new RegExp(`Calendar-year share\\s*${fmtPct(figures.calendarYearSharePct).replace('.', '\\.')}`),
    );
    expect(text).not.toMatch(/\d\.0 %/);
    expect(text).not.toMatch(/\d\.\d{3} kg/);
    // Days and times as the screens write them, not ISO.
    expect(text).toContain('Produced 1 Jun 2026, 12:00 UTC');
    expect(text).toContain('Commissioned 1 Jan 2020');
    expect(text).toMatch(/#\d+ \d{1,2} [A-Z][a-z]{2} 20\d\d, \d\d:\d\d UTC /);
    // The decision's assumptions in the decision page's words with units, not the engine's keys.
    expect(text).toContain('Leak to repair: Service valve');
    expect(text).toMatch(/Discount rate: \d+(\.\d)? %/);
    expect(text).toMatch(/Design life: \d+ years/);
    expect(text).not.toMatch(/discountRatePct|leakLocation|service_valve|recurrenceSource/);
    // Kept for looking at the pages (scripts/handover-preview renders page 1).
    const dir = process.env.HANDOVER_PDF_DIR;
    if (dir) {
      mkdirSync(dir, { recursive: true });
      writeFileSync(path.join(dir, 'handover.pdf'), res.body as Buffer);
    }
  });

  it('streams its progress and then the same file', async () => {
    const res = await owner.get(`/api/units/${unitId}/handover/progress`).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    const lines = (res.body as Buffer)
      .toString('utf8')
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l));
    // Every line is one the client's schema reads, nothing dropped: progress lines, then the file.
    for (const line of lines) expect(handoverLineDto.parse(line)).toEqual(line);
    const last = handoverFileLineDto.parse(lines.at(-1));
    for (const line of lines.slice(0, -1)) handoverProgressLineDto.parse(line);
    expect(lines[0]).toHaveProperty('total');
    expect(lines.slice(0, -1).at(-1)).toMatchObject({ done: lines[0].total });
    const { text } = await pdfText(Buffer.from(last.pdf, 'base64'));
    expect(text).toContain(last.checksum);
  });
});
