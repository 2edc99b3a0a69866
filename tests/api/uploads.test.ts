import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import sharp from 'sharp';
import type TestAgent from 'supertest/lib/agent';
import { createApp } from '../../server/app';
import { createHttpServer } from '../../server/lib/http-server';
import { createLocalStorage } from '../../server/lib/storage';
import type { Express } from 'express';
import { MAX_PHOTOS_PER_EVENT, MAX_UPLOAD_BYTES } from '../../shared/schemas/history';
import { MAX_IMPORT_BYTES } from '../../shared/schemas/imports';
import { openTestDb, resetDb } from '../support/db';
import { peakHeldBytes } from '../support/memory';
import { createTestUnit, createTestUser, signInAs, TEST_ORIGIN, TEST_PASSWORD } from '../support/factories';
import { openTestStorage, STORAGE_DRIVERS, type TestStorage } from '../support/storage-drivers';

const { db, pool } = openTestDb();
const scratch = mkdtempSync(path.join(os.tmpdir(), 'tightloop-upload-src-'));

beforeAll(() => resetDb(db));
afterAll(() => pool.end());

const pdf = (text: string) => Buffer.from(`%PDF-1.4\n% ${text}\n%%EOF\n`);

describe.each(STORAGE_DRIVERS)('photo and document uploads (%s storage)', (driver) => {
  let t: TestStorage;
  let app: Express;
  let technician: TestAgent;
  beforeAll(async () => {
    t = await openTestStorage(driver);
    app = createApp({ db, storage: t.storage, rateLimits: { signInPerIp: 1000 } }).app;
    technician = (await signInAs(app, db, 'technician')).agent;
  });
  afterAll(() => t.stop());

  /** The temporary files are removed when the response has been sent, a moment after the client has it. */
  const expectNothingLeft = async (before: string[]) => {
    await expect.poll(() => t.tempFiles(), { timeout: 2000 }).toEqual([]);
    expect(await t.keys()).toEqual(before);
  };

  async function newEvent() {
    const unit = await createTestUnit(db);
    const res = await technician
      .post('/api/visits')
      .set('Origin', TEST_ORIGIN)
      .send({
        idempotencyKey: randomUUID(),
        unitId: unit.id,
        occurredAt: new Date(Date.now() - 3600_000).toISOString(),
        events: [{ kind: 'note', note: 'Photos' }],
      });
    expect(res.status).toBe(201);
    return res.body.events[0].id as number;
  }

  const attach = (eventId: number, files: [Buffer | string, string][]) => {
    let req = technician.post(`/api/events/${eventId}/attachments`).set('Origin', TEST_ORIGIN);
    for (const [content, name] of files) req = req.attach('files', content, name);
    return req;
  };

  it('keeps a photo and its thumbnail and leaves no temporary file', async () => {
    const eventId = await newEvent();
    const png = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#36a' } })
      .png()
      .toBuffer();
    const res = await attach(eventId, [[png, 'door.png']]);
    expect(res.status).toBe(201);
    expect(res.body.attachments[0]).toMatchObject({
      mimeType: 'image/png',
      originalName: 'door.png',
      sizeBytes: png.length,
    });
    const file = await technician.get(res.body.attachments[0].url);
    expect(Buffer.compare(file.body as Buffer, png)).toBe(0);
    await expect.poll(() => t.tempFiles()).toEqual([]);
    // The photo and its thumbnail.
    expect(await t.keys()).toHaveLength(2);
  });

  it('returns 413 for a file over 10 MB and keeps nothing of the request', async () => {
    const eventId = await newEvent();
    const before = await t.keys();
    const big = path.join(scratch, 'big.pdf');
    writeFileSync(big, Buffer.concat([pdf('big'), Buffer.alloc(MAX_UPLOAD_BYTES, 0x20)]));
    const res = await attach(eventId, [
      [pdf('small one first'), 'small.pdf'],
      [big, 'big.pdf'],
    ]);
    expect(res.status).toBe(413);
    expect(res.body.error).toMatchObject({ code: 'too_large', message: 'Each file must be 10 MB or less.' });
    await expectNothingLeft(before);
  });

  it('returns 415 for a file whose content is not an image or PDF, whatever its name, and keeps nothing', async () => {
    const eventId = await newEvent();
    const before = await t.keys();
    const res = await attach(eventId, [
      [pdf('a good one'), 'report.pdf'],
      [Buffer.from('MZ\x90\x00 not a photo at all'), 'photo.jpg'],
    ]);
    expect(res.status).toBe(415);
    expect(res.body.error).toMatchObject({ code: 'unsupported_type' });
    expect(res.body.error.message).toContain('photo.jpg');
    await expectNothingLeft(before);
  });

  it('returns 415 for a file that starts like a PNG but is not one, and keeps the others of the request neither', async () => {
    const eventId = await newEvent();
    const before = await t.keys();
    const fake = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(2000, 7)]);
    const res = await attach(eventId, [
      [pdf('kept only if all are good'), 'report.pdf'],
      [fake, 'valve.png'],
    ]);
    expect(res.status).toBe(415);
    expect(res.body.error).toMatchObject({ code: 'unreadable_image', fields: { 'files.1': expect.any(String) } });
    await expectNothingLeft(before);
  });

  it('returns 400 for too many files at once or in all, and keeps nothing of the refused request', async () => {
    const eventId = await newEvent();
    const nine = Array.from(
      { length: MAX_PHOTOS_PER_EVENT + 1 },
      (_, i) => [pdf(`nine ${i}`), `doc${i}.pdf`] as [Buffer, string],
    );
    const before = await t.keys();
    const tooMany = await attach(eventId, nine);
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.code).toBe('too_many_files');
    await expectNothingLeft(before);

    expect((await attach(eventId, nine.slice(0, 7))).status).toBe(201);
    const seven = await t.keys();
    const over = await attach(eventId, [
      [pdf('ninth'), 'ninth.pdf'],
      [pdf('tenth'), 'tenth.pdf'],
    ]);
    expect(over.status).toBe(400);
    expect(over.body.error.message).toContain('at most 8 files; it has 7');
    await expectNothingLeft(seven);
  });

  it('keeps nothing of an upload whose connection is cut halfway', async () => {
    const before = await t.keys();
    const eventId = await newEvent();
    const user = await createTestUser(db, { role: 'technician' });
    const signIn = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send({ email: user.email, password: TEST_PASSWORD });
    const cookie = (signIn.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
    const server = createHttpServer(app);
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    const head = Buffer.from(
      `--cut\r\nContent-Disposition: form-data; name="files"; filename="half.pdf"\r\nContent-Type: application/pdf\r\n\r\n%PDF-1.4\n`,
    );
    const req = http.request({
      port: (server.address() as AddressInfo).port,
      host: '127.0.0.1',
      method: 'POST',
      path: `/api/events/${eventId}/attachments`,
      headers: {
        Origin: TEST_ORIGIN,
        Cookie: cookie,
        'Content-Type': 'multipart/form-data; boundary=cut',
        'Content-Length': 5 * 1024 * 1024,
      },
    });
    req.on('error', () => {}); // the cut is on purpose
    req.write(head);
    req.write(Buffer.alloc(1024 * 1024, 0x20));
    // Wait until the file is being written, then cut the connection.
    await expect.poll(() => t.tempFiles().length).toBe(1);
    req.destroy();
    await expectNothingLeft([...before].sort());
    server.close();
  });

  it('keeps memory flat while three maximum uploads arrive at once', { timeout: 120_000 }, async () => {
    // Each request carries the most an entry takes: 8 files of 10 MB.
    const file = path.join(scratch, 'max.pdf');
    writeFileSync(file, Buffer.concat([pdf('max'), Buffer.alloc(MAX_UPLOAD_BYTES - pdf('max').length, 0x20)]));
    const events = await Promise.all([newEvent(), newEvent(), newEvent()]);
    let results: { status: number }[] = [];
    const held = await peakHeldBytes(async () => {
      results = await Promise.all(
        events.map((id) =>
          attach(
            id,
            Array.from({ length: MAX_PHOTOS_PER_EVENT }, (_, i) => [file, `doc${i}.pdf`] as [string, string]),
          ),
        ),
      );
    }, 250);
    expect(results.map((r) => r.status)).toEqual([201, 201, 201]);
    console.info(`3 uploads of 8 × 10 MB at once: ${Math.round(held / 1024 / 1024)} MB held at the peak`);
    // The three carry 240 MB; streamed to disk or to S3 a part at a time, a few parts' worth (the client included).
    expect(held).toBeLessThan(100 * 1024 * 1024);
    await expect.poll(() => t.tempFiles()).toEqual([]);
  });
});

describe('fleet CSV uploads', () => {
  const root = mkdtempSync(path.join(os.tmpdir(), 'tightloop-uploads-'));
  const storage = createLocalStorage(root);
  const { app } = createApp({ db, storage, rateLimits: { signInPerIp: 1000 } });
  let engineer: TestAgent;
  beforeAll(async () => {
    engineer = (await signInAs(app, db, 'engineer')).agent;
  });

  /** Every file under the storage root, temporary ones included. */
  function filesIn(dir: string): string[] {
    if (!existsSync(dir)) return [];
    return readdirSync(dir, { recursive: true, withFileTypes: true })
      .filter((e) => e.isFile())
      .map((e) => path.relative(root, path.join(e.parentPath, e.name)))
      .sort();
  }
  const expectNothingLeft = async (before: string[]) => {
    await expect.poll(() => filesIn(storage.tempDir), { timeout: 2000 }).toEqual([]);
    expect(filesIn(root)).toEqual(before);
  };

  const previewCsv = (content: Buffer | string, name = 'fleet.csv') =>
    engineer
      .post('/api/unit-imports/preview')
      .set('Origin', TEST_ORIGIN)
      .attach('file', Buffer.from(content), { filename: name, contentType: 'text/csv' });

  it('returns 413 for a file over 25 MB and leaves no temporary file', async () => {
    const before = filesIn(root);
    const res = await previewCsv(Buffer.alloc(MAX_IMPORT_BYTES + 1, 'a'));
    expect(res.status).toBe(413);
    expect(res.body.error.message).toBe('The file is larger than 25 MB.');
    await expectNothingLeft(before);
  });

  it('returns 415 for a workbook named .csv as soon as its first bytes arrive, and leaves nothing', async () => {
    const before = filesIn(root);
    const res = await previewCsv(Buffer.concat([Buffer.from('PK\u0003\u0004'), Buffer.alloc(4 * 1024 * 1024, 1)]));
    expect(res.status).toBe(415);
    expect(res.body.error.message).toContain('spreadsheet workbook');
    await expectNothingLeft(before);
  });

  it('previews a file read from disk and removes it afterwards', async () => {
    const before = filesIn(root);
    const res = await previewCsv('container_number,refrigerant,nominal_charge_kg\nHRLU1000016,R-134a,4.5\n');
    expect(res.status).toBe(200);
    expect(res.body.preview).toMatchObject({ totalRows: 1, errorCount: 0 });
    await expectNothingLeft(before);
  });
});
