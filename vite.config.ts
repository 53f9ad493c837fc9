import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import fs from 'node:fs/promises';
import path from 'node:path';
import { promisify } from 'node:util';
import zlib from 'node:zlib';
import { defineConfig, type Plugin, type ProxyOptions } from 'vite';

const brotli = promisify(zlib.brotliCompress);
const gzip = promisify(zlib.gzip);

/**
 * Writes a brotli (.br, quality 11) and a gzip (.gz, level 9) copy beside each built script,
 * stylesheet and SVG of assets/ over 1 KB, compressed once at build time as hard as each format
 * goes; the server sends them to clients that accept them (server/http/compression.ts).
 */
function precompressAssets(): Plugin {
  return {
    name: 'hilum-precompress-assets',
    apply: 'build',
    async writeBundle(options, bundle) {
      const outDir = options.dir ?? 'dist';
      const files = Object.keys(bundle).filter(
        (name) => name.startsWith('assets/') && /\.(js|css|svg)$/.test(name),
      );
      await Promise.all(
        files.map(async (name) => {
          const file = path.join(outDir, name);
          const raw = await fs.readFile(file);
          if (raw.length < 1024) return;
          const [br, gz] = await Promise.all([
            brotli(raw, {
              params: {
                [zlib.constants.BROTLI_PARAM_QUALITY]: zlib.constants.BROTLI_MAX_QUALITY,
                [zlib.constants.BROTLI_PARAM_SIZE_HINT]: raw.length,
              },
            }),
            gzip(raw, { level: zlib.constants.Z_BEST_COMPRESSION }),
          ]);
          await Promise.all([fs.writeFile(`${file}.br`, br), fs.writeFile(`${file}.gz`, gz)]);
        }),
      );
    },
  };
}

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
  plugins: [react(), tailwindcss(), precompressAssets()],
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
