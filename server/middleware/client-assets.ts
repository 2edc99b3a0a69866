// The built client: brotli/gzip files made at build time (dist/**/*.br, *.gz) picked by Accept-Encoding, hashed
// assets cached for a year, everything else (index.html, the service worker, the manifest) revalidated every time.
import compression from 'compression';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import expressStaticGzip from 'express-static-gzip';

const YEAR_S = 365 * 24 * 3600;
// Vite puts a content hash in every file name under /assets/: a changed file gets a new name, so it never goes stale.
const HASHED = /[\\/]assets[\\/][^\\/]+-[A-Za-z0-9_-]{8}(\.[a-z0-9]+)+$/;

export function clientAssets(clientDir: string): { files: RequestHandler; indexHtml: RequestHandler } {
  const files = expressStaticGzip(clientDir, {
    enableBrotli: true,
    orderPreference: ['br', 'gz'],
    index: false,
    serveStatic: {
      index: false,
      // Cache-Control is set per file below; serve-static's own would be max-age=0 otherwise.
      cacheControl: false,
      setHeaders: (res, filePath) => {
        res.setHeader('Cache-Control', HASHED.test(filePath) ? `public, max-age=${YEAR_S}, immutable` : 'no-cache');
      },
    },
  });
  // History fallback: any other GET is a client route and gets index.html (compressed, revalidated).
  const indexHtml: RequestHandler = (req: Request, res: Response, next: NextFunction) => {
    // A hashed asset that is not there (an old page after a new build) must not get HTML with a 200.
    if (req.path.startsWith('/assets/')) return void res.status(404).type('text/plain').send('Not found');
    req.url = '/index.html';
    files(req, res, next);
  };
  return { files, indexHtml };
}

/** JSON answers compressed on the fly (a unit's history is tens of KB of repetitive JSON). */
export function apiCompression(): RequestHandler {
  return compression({ threshold: 1024 });
}
