import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import fs from 'node:fs/promises';
import path from 'node:path';
import { promisify } from 'node:util';
import zlib from 'node:zlib';
import { defineConfig, type Plugin, type ProxyOptions } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';

const brotli = promisify(zlib.brotliCompress);
const gzip = promisify(zlib.gzip);

/**
 * Writes a brotli (.br, quality 11) and a gzip (.gz, level 9) copy beside each built script,
 * stylesheet and SVG of assets/, compressed once at build time as hard as each format goes, where
 * the copy is smaller; the server sends them to clients that accept them (server/http/compression.ts).
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
          const [br, gz] = await Promise.all([
            brotli(raw, {
              params: {
                [zlib.constants.BROTLI_PARAM_QUALITY]: zlib.constants.BROTLI_MAX_QUALITY,
                [zlib.constants.BROTLI_PARAM_SIZE_HINT]: raw.length,
              },
            }),
            gzip(raw, { level: zlib.constants.Z_BEST_COMPRESSION }),
          ]);
          // Small files too: the first visit loads a dozen scripts under 1 KB, each about half the
          // size compressed. A copy no smaller than the file is not written.
          await Promise.all([
            br.length < raw.length ? fs.writeFile(`${file}.br`, br) : undefined,
            gz.length < raw.length ? fs.writeFile(`${file}.gz`, gz) : undefined,
          ]);
        }),
      );
    },
  };
}

/**
 * The installable app: the web app manifest (/manifest.webmanifest; the icons are drawn for Hilum in
 * public/icons, rendered by scripts/render-icons.ts) and the service worker
 * (src/service-worker/sw.ts, built to /sw.js, registered by src/lib/register-service-worker.ts).
 * Its precache is the app shell only — index.html and the files it names, the icons — so that
 * installing it on a first visit fetches nothing the page had not fetched already; each page's
 * own files are kept as they are used.
 */
function installableApp(): Plugin[] {
  let outDir = 'dist';
  const shellFiles = new Set<string>();
  const readShell: Plugin = {
    name: 'hilum-app-shell-files',
    apply: 'build',
    configResolved(config) {
      outDir = path.resolve(config.root, config.build.outDir);
    },
  };
  return [
    readShell,
    ...VitePWA({
      strategies: 'injectManifest',
      srcDir: 'src/service-worker',
      filename: 'sw.ts',
      injectRegister: false,
      manifest: {
        name: 'Hilum seed bank',
        short_name: 'Hilum',
        description:
          'Your seed bank at the bench: lots, germination counts and the sowing plan, on the phone, with or without a signal.',
        id: '/',
        start_url: '/',
        scope: '/',
        display: 'standalone',
        orientation: 'portrait',
        // moss-700 and husk-50 of the app's palette (tailwind.config.ts).
        theme_color: '#3d5626',
        background_color: '#fcfaf4',
        icons: [
          { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
          { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
          { src: '/icons/icon-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
      },
      injectManifest: {
        globPatterns: ['**/*.{html,js,css,svg,png,webmanifest}'],
        manifestTransforms: [
          async (entries) => {
            const html = await fs.readFile(path.join(outDir, 'index.html'), 'utf8');
            shellFiles.clear();
            for (const m of html.matchAll(/(?:src|href)="\/([^"]+)"/g)) shellFiles.add(m[1]!);
            // The plugin adds the manifest and its icons itself.
            const inShell = (url: string) => url === 'index.html' || shellFiles.has(url);
            return { manifest: entries.filter((entry) => inShell(entry.url)), warnings: [] };
          },
        ],
      },
    }),
  ];
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
  plugins: [react(), tailwindcss(), precompressAssets(), ...installableApp()],
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
