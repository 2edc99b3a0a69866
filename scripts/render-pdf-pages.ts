// Renders pages of a PDF to PNG in headless Chromium with PDF.js (the build unpdf ships), for looking at generated
// documents: `npx tsx scripts/render-pdf-pages.ts <file.pdf> <out-prefix> [pages=1]` writes <out-prefix>-<n>.png.
import { readFileSync, writeFileSync, mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from './lib/chromium';

const [file, prefix, pagesArg = '1'] = process.argv.slice(2);
if (!file || !prefix) {
  console.error('usage: tsx scripts/render-pdf-pages.ts <file.pdf> <out-prefix> [pages]');
  process.exit(2);
}
const pdfjs = readFileSync(path.resolve('node_modules/unpdf/dist/pdfjs.mjs'));
const pdf = readFileSync(file);
const ORIGIN = 'http://render.local';

const context = await chromium.launchPersistentContext(mkdtempSync(path.join(os.tmpdir(), 'render-pdf-')), {
  executablePath: CHROMIUM_PATH,
  args: CHROMIUM_ARGS,
  viewport: { width: 1000, height: 1400 },
});
const page = context.pages()[0] ?? (await context.newPage());
await page.route(`${ORIGIN}/**`, (route) => {
  const url = route.request().url();
  if (url.endsWith('/pdfjs.mjs')) return route.fulfill({ body: pdfjs, contentType: 'text/javascript' });
  if (url.endsWith('/doc.pdf')) return route.fulfill({ body: pdf, contentType: 'application/pdf' });
  return route.fulfill({
    body: '<!doctype html><body style="margin:0;background:#777"></body>',
    contentType: 'text/html',
  });
});
await page.goto(`${ORIGIN}/`);
const count = await page.evaluate(async (n: number) => {
  const lib = await import('/pdfjs.mjs' as string);
  const data = new Uint8Array(await (await fetch('/doc.pdf')).arrayBuffer());
  const doc = await lib.getDocument({ data }).promise;
  for (let i = 1; i <= Math.min(n, doc.numPages); i++) {
    const p = await doc.getPage(i);
    const viewport = p.getViewport({ scale: 1.6 });
    const canvas = document.createElement('canvas');
    canvas.width = viewport.width;
    canvas.height = viewport.height;
    canvas.id = `page-${i}`;
    canvas.style.display = 'block';
    canvas.style.marginBottom = '8px';
    document.body.appendChild(canvas);
    await p.render({ canvasContext: canvas.getContext('2d'), viewport }).promise;
  }
  return Math.min(n, doc.numPages);
}, Number(pagesArg));
for (let i = 1; i <= count; i++) {
  const png = await page.locator(`#page-${i}`).screenshot();
  writeFileSync(`${prefix}-${i}.png`, png);
  console.log(`${prefix}-${i}.png`);
}
await context.close();
