import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

// The Express server owns /api (JSON) and /u (QR label links); in development Vite forwards both to it.
const apiOrigin = 'http://localhost:3000';

export default defineConfig({
  plugins: [react(), tailwindcss()],
  build: { outDir: 'dist' },
  server: {
    port: 5173,
    strictPort: true,
    proxy: {
      '/api': { target: apiOrigin },
      '/u': { target: apiOrigin },
    },
  },
});
