import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { brotliCompressSync, constants, gzipSync } from 'node:zlib';
import { defineConfig, type Plugin, type Rolldown } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';

// The Express server owns /api; in development Vite forwards it there. /u/<token> (QR labels) is a client route.
const apiOrigin = 'http://localhost:3000';

/** Brotli and gzip copies of the built text files, made once here so the server only picks one (express-static-gzip). */
function compressAssets(): Plugin {
  const COMPRESSIBLE = /\.(js|mjs|css|html|svg|json|webmanifest|txt)$/;
  let outDir = 'dist';
  const compressDir = (dir: string): void => {
    for (const name of readdirSync(dir)) {
      const file = path.join(dir, name);
      if (statSync(file).isDirectory()) compressDir(file);
      else if (COMPRESSIBLE.test(name)) {
        const body = readFileSync(file);
        if (body.length < 512) continue;
        writeFileSync(`${file}.br`, brotliCompressSync(body, { params: { [constants.BROTLI_PARAM_QUALITY]: 11 } }));
        writeFileSync(`${file}.gz`, gzipSync(body, { level: 9 }));
      }
    }
  };
  return {
    name: 'tightloop:compress-assets',
    apply: 'build',
    enforce: 'post',
    configResolved(config) {
      outDir = path.resolve(config.root, config.build.outDir);
    },
    // After every other plugin has written its files (the service worker among them).
    closeBundle: { order: 'post', sequential: true, handler: () => compressDir(outDir) },
  };
}

// A label's address (/u/<token>) is what a scanned QR code opens. The app's own script needs a second or more to
// arrive and start on a slow phone; this small classic script runs first and asks at once for what the unit page will
// ask for (the signed-in person, the unit, its figures) and for the unit page's code. The app takes those answers
// from `window.__tightloopEarly` instead of asking again (src/lib/early-responses.ts). A separate file, not inline:
// the Content-Security-Policy allows scripts from the app's origin only.
const LABEL_PAGE_MODULE = /[\\/]features[\\/]history[\\/]components[\\/]service-history\.tsx$/;

function bootScript(preload: string[]): string {
  return `(function () {
  var m = /^\\/u\\/([A-Za-z0-9_-]{16,64})\\/?$/.exec(location.pathname);
  // With no signal everything comes from the service worker at once; preloading would only crowd the app's start.
  if (!m || navigator.onLine === false || typeof fetch !== 'function') return;
  ${JSON.stringify(preload)}.forEach(function (href) {
    var link = document.createElement('link');
    link.rel = 'modulepreload';
    link.href = href;
    document.head.appendChild(link);
  });
  var early = {};
  ['/api/auth/me', '/api/units/by-token/' + m[1], '/api/units/by-token/' + m[1] + '/overview'].forEach(function (url) {
    early[url] = fetch(url, { credentials: 'include', headers: { Accept: 'application/json' } });
    early[url].catch(function () {});
  });
  window.__tightloopEarly = early;
})();
`;
}

function labelBoot(): Plugin {
  return {
    name: 'tightloop:label-boot',
    apply: 'build',
    enforce: 'post',
    generateBundle(_options, bundle) {
      const chunks = Object.values(bundle).filter((f): f is Rolldown.OutputChunk => f.type === 'chunk');
      const byName = new Map(chunks.map((c) => [c.fileName, c]));
      const entry = chunks.find((c) => c.isEntry);
      const page = chunks.find((c) => c.moduleIds.some((id) => LABEL_PAGE_MODULE.test(id)));
      if (!entry || !page) throw new Error('label boot: the entry or the unit page chunk (service-history) is missing');
      // What the unit page's chunk imports, less what the entry has already brought.
      const closure = (start: Rolldown.OutputChunk, into = new Set<string>()) => {
        for (const f of [start.fileName, ...start.imports]) {
          if (into.has(f)) continue;
          into.add(f);
          const next = byName.get(f);
          if (next && next !== start) closure(next, into);
        }
        return into;
      };
      const inEntry = closure(entry);
      const preload = [...closure(page)].filter((f) => !inEntry.has(f)).map((f) => `/${f}`);
      const source = bootScript(preload);
      const fileName = `assets/label-boot-${createHash('sha256').update(source).digest('base64url').slice(0, 8)}.js`;
      this.emitFile({ type: 'asset', fileName, source });
      const html = bundle['index.html'];
      if (html?.type !== 'asset') throw new Error('label boot: index.html is not in the bundle');
      // Right after the character set, before the app's module script, so it runs while that is still on its way.
      html.source = String(html.source).replace(
        /<meta charset[^>]*>/,
        (meta) => `${meta}\n    <script src="/${fileName}"></script>`,
      );
    },
  };
}

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // Installable, and the app shell opens with no signal: every built file is precached by the service worker and
    // any page address falls back to index.html. Unit data offline comes from the persisted query cache, not from here.
    VitePWA({
      registerType: 'prompt',
      injectRegister: false,
      // globPatterns below already take every icon and the favicon from the built folder; listed twice otherwise.
      includeManifestIcons: false,
      manifest: {
        id: '/',
        name: 'Tightloop',
        short_name: 'Tightloop',
        description: 'Service history for refrigerated container units: scan a label, see the unit, record a visit.',
        lang: 'en',
        start_url: '/',
        scope: '/',
        display: 'standalone',
        orientation: 'any',
        theme_color: '#0b161d',
        background_color: '#f3f4ee',
        icons: [
          { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
          { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
          { src: '/icons/maskable-192.png', sizes: '192x192', type: 'image/png', purpose: 'maskable' },
          { src: '/icons/maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
      },
      workbox: {
        globPatterns: ['**/*.{js,css,html,svg,png,woff2,webmanifest}'],
        // zxing (~85 KB compressed) is only for phones whose browser has no barcode detector: not downloaded by every
        // install, but kept once a scan has fetched it, so the scanner works offline after its first use.
        globIgnores: ['**/zxing-camera-*.js'],
        runtimeCaching: [
          {
            urlPattern: ({ url }) => /^\/assets\/zxing-camera-[\w-]+\.js$/.test(url.pathname),
            handler: 'CacheFirst',
            options: { cacheName: 'tightloop-zxing', expiration: { maxEntries: 2 } },
          },
        ],
        maximumFileSizeToCacheInBytes: 1024 * 1024,
        navigateFallback: '/index.html',
        navigateFallbackDenylist: [/^\/api\//],
        cleanupOutdatedCaches: true,
        // A new version waits until the page says so (the update prompt), never mid-form.
        skipWaiting: false,
        clientsClaim: false,
      },
    }),
    labelBoot(),
    compressAssets(),
  ],
  // The manifest lets the budget test follow what the unit page loads.
  build: { outDir: 'dist', chunkSizeWarningLimit: 600, manifest: true },
  server: {
    port: 5173,
    strictPort: true,
    proxy: {
      '/api': { target: apiOrigin },
    },
  },
});
