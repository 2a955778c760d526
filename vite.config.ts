import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

// The web server's port; the dev server forwards /api (HTTP and the live-feed WebSocket) to it.
const apiPort = process.env.PORT ?? '3000';

export default defineConfig({
  root: '.',
  plugins: [react(), tailwindcss()],
  build: { outDir: 'dist', emptyOutDir: true },
  server: {
    host: '127.0.0.1',
    port: 5173,
    strictPort: true,
    proxy: {
      '/api': { target: `http://127.0.0.1:${apiPort}`, ws: true, changeOrigin: false },
    },
  },
  preview: { host: '127.0.0.1', port: 4173 },
});
