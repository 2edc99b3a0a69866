import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { brotliCompressSync, constants, gzipSync } from 'node:zlib';
import { defineConfig, type Plugin } from 'vite';
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

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // Installable, and the app shell opens with no signal: every built file is precached by the service worker and
    // any page address falls back to index.html. Unit data offline comes from the persisted query cache, not from here.
    VitePWA({
      registerType: 'prompt',
      injectRegister: false,
      includeAssets: ['favicon.svg', 'icons/apple-touch-icon-180.png'],
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
        // The camera reader's fallback decoder (zxing) is big and only needed where the browser has no barcode detector.
        maximumFileSizeToCacheInBytes: 1024 * 1024,
        navigateFallback: '/index.html',
        navigateFallbackDenylist: [/^\/api\//],
        cleanupOutdatedCaches: true,
        // A new version waits until the page says so (the update prompt), never mid-form.
        skipWaiting: false,
        clientsClaim: false,
      },
    }),
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
