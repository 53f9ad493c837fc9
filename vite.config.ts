import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig, type ProxyOptions } from 'vite';

function portFromEnv(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 1 || port > 65_535) {
    throw new Error(`${name} must be a port number between 1 and 65535, got "${raw}"`);
  }
  return port;
}

const port = portFromEnv('PORT', 3000);
const apiTarget = `http://127.0.0.1:${portFromEnv('HILUM_API_PORT', 3001)}`;

// The API and the development mailbox live on the Express server; the browser only ever talks to
// Vite's origin, so the session cookie stays same-origin in development too.
const proxy: Record<string, ProxyOptions> = {
  '/api': { target: apiTarget, changeOrigin: false },
  '/dev/outbox': { target: apiTarget, changeOrigin: false },
};

export default defineConfig({
  plugins: [react(), tailwindcss()],
  build: {
    outDir: 'dist',
  },
  server: {
    host: '127.0.0.1',
    port,
    strictPort: true,
    proxy,
    watch: {
      // The local database cluster and the object store's files change constantly at run time.
      ignored: ['**/.data/**', '**/uploads/**'],
    },
  },
  preview: {
    host: '127.0.0.1',
    port,
    strictPort: true,
    proxy,
  },
});
