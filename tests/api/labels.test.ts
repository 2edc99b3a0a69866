import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { PDFDocument } from 'pdf-lib';
import { createApp } from '../../server/app';
import { LABEL_HEIGHT, LABEL_WIDTH } from '../../server/features/labels/label-sheet';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs, TEST_ORIGIN } from '../support/factories';
import { decodePdfQrCodes } from '../support/pdf-qr';

const PUBLIC_URL = TEST_ORIGIN;
const { db, pool } = openTestDb();
const { app } = createApp({ db, publicUrl: PUBLIC_URL, rateLimits: { signInPerIp: 1000 } });
let engineer: TestAgent;
let technician: TestAgent;

beforeAll(async () => {
  await resetDb(db);
  engineer = (await signInAs(app, db, 'engineer')).agent;
  technician = (await signInAs(app, db, 'technician')).agent;
});
afterAll(() => pool.end());

const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

describe('QR label sheets', () => {
  it('prints eight labels to an A4 page; each QR decodes to its unit’s address', async () => {
    const unitsToPrint = [];
    for (let i = 0; i < 9; i++)
      unitsToPrint.push(await createTestUnit(db, { refrigerant: i % 2 ? 'R-513A' : 'R-134a' }));
    const res = await engineer
      .post('/api/labels')
      .set('Origin', TEST_ORIGIN)
      .send({ unitIds: unitsToPrint.map((u) => u.id) })
      .buffer(true)
      .parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const pdf = res.body as Buffer;
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    const doc = await PDFDocument.load(pdf);
    expect(doc.getPageCount()).toBe(2);
    const { width, height } = doc.getPage(0).getSize();
    expect([Math.round(width), Math.round(height)]).toEqual([595, 842]);
    const urls = unitsToPrint.map((u) => `${PUBLIC_URL}/u/${u.qrToken}`);
    expect(await decodePdfQrCodes(pdf)).toEqual([urls.slice(0, 8), urls.slice(8)]);
  });

  it('prints a single label on a page of its own size', async () => {
    const unit = await createTestUnit(db, { refrigerant: 'R-744', nominalChargeKg: 5.25 });
    const res = await engineer.get(`/api/units/${unit.id}/label`).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toContain(unit.containerNumber);
    const doc = await PDFDocument.load(res.body as Buffer);
    expect(doc.getPageCount()).toBe(1);
    const size = doc.getPage(0).getSize();
    expect(size.width).toBeCloseTo(LABEL_WIDTH);
    expect(size.height).toBeCloseTo(LABEL_HEIGHT);
    expect(await decodePdfQrCodes(res.body as Buffer)).toEqual([[`${PUBLIC_URL}/u/${unit.qrToken}`]]);
  });

  it('answers 404 naming unknown units, 400 for an empty or oversized selection', async () => {
    const unit = await createTestUnit(db);
    const missing = await engineer
      .post('/api/labels')
      .set('Origin', TEST_ORIGIN)
      .send({ unitIds: [unit.id, 999999] });
    expect(missing.status).toBe(404);
    expect(missing.body.error.message).toContain('999999');
    expect((await engineer.post('/api/labels').set('Origin', TEST_ORIGIN).send({ unitIds: [] })).status).toBe(400);
    const many = Array.from({ length: 501 }, (_, i) => i + 1);
    expect((await engineer.post('/api/labels').set('Origin', TEST_ORIGIN).send({ unitIds: many })).status).toBe(400);
    expect((await engineer.get('/api/units/999999/label')).status).toBe(404);
  });

  it('is for those who manage units: 403 for a technician, 401 without a session', async () => {
    const unit = await createTestUnit(db);
    expect(
      (
        await technician
          .post('/api/labels')
          .set('Origin', TEST_ORIGIN)
          .send({ unitIds: [unit.id] })
      ).status,
    ).toBe(403);
    expect((await technician.get(`/api/units/${unit.id}/label`)).status).toBe(403);
    expect((await request(app).get(`/api/units/${unit.id}/label`)).status).toBe(401);
  });
});
