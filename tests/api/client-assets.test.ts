// Issue 19: the built client is served compressed (files made at build time) and cached by what its name promises;
// API JSON is compressed on the fly.
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { brotliCompressSync, gzipSync } from 'node:zlib';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { openTestDb, resetDb } from '../support/db';
import { createTestUnit, signInAs } from '../support/factories';

const { db, pool } = openTestDb();
const clientDir = mkdtempSync(path.join(os.tmpdir(), 'tightloop-client-'));
const script = `console.log(${JSON.stringify('reefer '.repeat(400))});`;
const html = `<!doctype html><html><head><script type="module" src="/assets/index-AbCd1234.js"></script></head><body>${' '.repeat(600)}</body></html>`;
mkdirSync(path.join(clientDir, 'assets'));
writeFileSync(path.join(clientDir, 'index.html'), html);
writeFileSync(path.join(clientDir, 'index.html.br'), brotliCompressSync(html));
writeFileSync(path.join(clientDir, 'index.html.gz'), gzipSync(html));
writeFileSync(path.join(clientDir, 'assets', 'index-AbCd1234.js'), script);
writeFileSync(path.join(clientDir, 'assets', 'index-AbCd1234.js.br'), brotliCompressSync(script));
writeFileSync(path.join(clientDir, 'assets', 'index-AbCd1234.js.gz'), gzipSync(script));
writeFileSync(path.join(clientDir, 'sw.js'), 'self.addEventListener("fetch", () => {});');
const { app } = createApp({ db, clientDir });

beforeAll(() => resetDb(db));
afterAll(() => pool.end());

describe('serving the built client', () => {
  it('sends the brotli file made at build time, cached for a year as immutable', async () => {
    const res = await request(app).get('/assets/index-AbCd1234.js').set('Accept-Encoding', 'gzip, deflate, br');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['content-type']).toMatch(/javascript/);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.headers.vary).toMatch(/Accept-Encoding/i);
    expect(Number(res.headers['content-length'])).toBeLessThan(script.length / 10);
  });

  it('sends gzip to a browser without brotli, and the plain file to one without either', async () => {
    const gz = await request(app).get('/assets/index-AbCd1234.js').set('Accept-Encoding', 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    const plain = await request(app).get('/assets/index-AbCd1234.js').set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.text).toBe(script);
  });

  it('sends index.html for a client route, compressed and revalidated every time', async () => {
    const res = await request(app).get('/u/some-label-token-1234').set('Accept-Encoding', 'br');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/html/);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['cache-control']).toBe('no-cache');
    expect(res.headers.etag).toBeTruthy();
  });

  it('revalidates the service worker every time, so a new version is found', async () => {
    const res = await request(app).get('/sw.js');
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toBe('no-cache');
  });

  it('answers 404, not the app page, for a hashed asset that is not there (a stale page after a new build)', async () => {
    const res = await request(app).get('/assets/index-ZzZz9999.js');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).not.toMatch(/html/);
  });

  it('compresses JSON answers from the API and keeps them out of every cache', async () => {
    const { agent } = await signInAs(app, db, 'engineer');
    for (let i = 0; i < 30; i++) await createTestUnit(db);
    const res = await agent.get('/api/units?pageSize=30').set('Accept-Encoding', 'gzip, br');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toMatch(/^(br|gzip)$/);
    expect(res.headers['cache-control']).toBe('no-store');
    expect(res.body.items?.length ?? res.body.units?.length ?? 0).toBeGreaterThan(0);
  });
});
