import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

// The Express server owns /api; in development Vite forwards it there. /u/<token> (QR labels) is a client route.
const apiOrigin = 'http://localhost:3000';

export default defineConfig({
  plugins: [react(), tailwindcss()],
  build: { outDir: 'dist' },
  server: {
    port: 5173,
    strictPort: true,
    proxy: {
      '/api': { target: apiOrigin },
    },
  },
});
