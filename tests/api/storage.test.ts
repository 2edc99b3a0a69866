import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { readStored, sendStoredFile } from '../../server/lib/storage';
import { peakHeldBytes } from '../support/memory';
import { openTestStorage, STORAGE_DRIVERS, type TestStorage } from '../support/storage-drivers';

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

describe.each(STORAGE_DRIVERS)('storage on %s', (driver) => {
  let t: TestStorage;
  beforeAll(async () => {
    t = await openTestStorage(driver);
  });
  afterAll(() => t.stop());

  /** A finished upload waiting in the temporary folder, as the upload middleware leaves it. */
  function upload(bytes: Buffer): string {
    mkdirSync(t.storage.tempDir, { recursive: true });
    const file = path.join(t.storage.tempDir, `${randomBytes(6).toString('hex')}.part`);
    writeFileSync(file, bytes);
    return file;
  }

  it('keeps bytes under their SHA-256 and reads them back', async () => {
    const bytes = randomBytes(1000);
    const stored = await t.storage.put(bytes);
    expect(stored).toEqual({ key: sha256(bytes), created: true });
    const file = await t.storage.open(stored.key);
    expect(file?.size).toBe(1000);
    expect(await readStored(t.storage, stored.key)).toEqual(bytes);
  });

  it('says the same bytes were stored already, so nothing is removed on the second caller’s behalf', async () => {
    const bytes = randomBytes(500);
    expect((await t.storage.put(bytes)).created).toBe(true);
    expect((await t.storage.put(bytes)).created).toBe(false);
    const again = upload(bytes);
    expect(await t.storage.putFile(again, sha256(bytes))).toEqual({ key: sha256(bytes), created: false });
    expect(existsSync(again)).toBe(false);
  });

  it('moves a finished upload into the store, hashing it when no hash is given, and leaves no temporary file', async () => {
    const bytes = randomBytes(70_000);
    const file = upload(bytes);
    const stored = await t.storage.putFile(file);
    expect(stored).toEqual({ key: sha256(bytes), created: true });
    expect(existsSync(file)).toBe(false);
    expect(t.tempFiles()).toEqual([]);
    expect(await t.keys()).toContain(stored.key);
    expect(await readStored(t.storage, stored.key)).toEqual(bytes);
  });

  it('returns null for a key it does not hold and for anything that is not a key', async () => {
    expect(await t.storage.open(sha256(Buffer.from('never stored')))).toBeNull();
    expect(await t.storage.open('../../etc/passwd')).toBeNull();
    expect(await t.storage.open('')).toBeNull();
  });

  it('removes a stored file, and removing one it does not hold is harmless', async () => {
    const stored = await t.storage.put(randomBytes(300));
    await t.storage.remove(stored.key);
    expect(await t.storage.open(stored.key)).toBeNull();
    expect(await t.keys()).not.toContain(stored.key);
    await expect(t.storage.remove(stored.key)).resolves.toBeUndefined();
    await expect(t.storage.remove('not-a-key')).resolves.toBeUndefined();
  });

  it('serves a stored file as a response body with its length, and survives a client that leaves halfway', async () => {
    const bytes = randomBytes(3 * 1024 * 1024);
    const { key } = await t.storage.put(bytes);
    const server = http.createServer((_req, res) => {
      void t.storage.open(key).then((file) => sendStoredFile(res, file!));
    });
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/`;
    try {
      const res = await fetch(url);
      expect(res.headers.get('content-length')).toBe(String(bytes.length));
      // Compared by hash: a deep comparison of two 3 MB buffers takes Vitest tens of seconds.
      expect(sha256(Buffer.from(await res.arrayBuffer()))).toBe(key);
      // A client that reads a little and goes away.
      const cut = new AbortController();
      const partial = await fetch(url, { signal: cut.signal });
      await partial.body!.getReader().read();
      cut.abort();
      // The server goes on serving.
      expect((await fetch(url)).status).toBe(200);
    } finally {
      server.closeAllConnections();
      await new Promise((r) => server.close(r));
    }
  });

  it('streams a 40 MB file in and out without holding it in memory', { timeout: 60_000 }, async () => {
    // Several parts for S3 (5 MB each); content that differs per part so a reordered part would show.
    const bytes = Buffer.alloc(40 * 1024 * 1024);
    for (let i = 0; i < bytes.length; i += 4096) bytes.writeUInt32BE(i, i);
    const key = sha256(bytes);
    const file = upload(bytes);
    const held = await peakHeldBytes(async () => {
      await t.storage.putFile(file, key);
      const opened = await t.storage.open(key);
      expect(opened?.size).toBe(bytes.length);
      const hash = createHash('sha256');
      for await (const chunk of opened!.stream) hash.update(chunk as Buffer);
      expect(hash.digest('hex')).toBe(key);
    });
    // The whole file is 40 MB; S3 holds one 5 MB part at a time (the fake S3 server runs in its own process).
    expect(held).toBeLessThan(30 * 1024 * 1024);
  });
});
