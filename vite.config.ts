import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { brotliCompressSync, constants, gzipSync } from 'node:zlib';
import { defineConfig, type Plugin } from 'vite';

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
  plugins: [react(), tailwindcss(), compressAssets()],
  build: { outDir: 'dist' },
  server: {
    port: 5173,
    strictPort: true,
    proxy: {
      '/api': { target: apiOrigin },
    },
  },
});
