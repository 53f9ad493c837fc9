// The service worker (built by vite-plugin-pwa's injectManifest into /sw.js, which also writes the
// precache list below): the app opens without a network on the pages already visited.
// Precached: the app shell (index.html, the entry script and what it preloads, the stylesheet, the
// icons) — nothing more, so installing it on a first visit fetches nothing the page had not
// fetched already. Kept as used: each page's built files (cache first: their names change with
// their content) and the API reads the pages made (network first; the last answer when there is
// no network). Writes are never touched: the page's own queue keeps and sends them
// (src/lib/write-queue.ts). Written without Workbox's runtime: its modules would have added about
// 5 KB compressed to a first visit on a slow phone, over the app's 200 KB budget for scripts.
import { API_CACHE, ASSETS_CACHE, CACHE_ASSETS_MESSAGE } from '#src/lib/offline-caches';

interface ExtendableEvent extends Event {
  waitUntil(promise: Promise<unknown>): void;
}
interface FetchEvent extends ExtendableEvent {
  request: Request;
  respondWith(response: Promise<Response>): void;
}
interface ServiceWorkerScope {
  __WB_MANIFEST: Array<{ url: string; revision: string | null }>;
  location: Location;
  skipWaiting(): Promise<void>;
  clients: { claim(): Promise<void> };
  addEventListener(type: 'install' | 'activate', listener: (event: ExtendableEvent) => void): void;
  addEventListener(type: 'fetch', listener: (event: FetchEvent) => void): void;
  addEventListener(type: 'message', listener: (event: ExtendableEvent & MessageEvent) => void): void;
}
declare const self: ServiceWorkerScope;

// Once each (the plugin lists the manifest and its icons beside what the build config chose, and
// the Cache API refuses a list that names a file twice).
const shell = [...new Map(self.__WB_MANIFEST.map((entry) => [entry.url, entry])).values()];
/** The shell's own cache, named by its contents: a new release installs beside the old one. */
const SHELL_CACHE = `hilum-shell-${hash(JSON.stringify(shell))}`;
const INDEX = new URL('/index.html', self.location.href).href;
/** How long a page opened by address waits for the network before the kept shell opens it. */
const NAVIGATION_WAIT_MS = 4000;
/** How long an API read waits for the network before the last kept answer is shown. */
const API_WAIT_MS = 10_000;

function hash(text: string): string {
  let h = 0;
  for (let i = 0; i < text.length; i += 1) h = (Math.imul(31, h) + text.charCodeAt(i)) | 0;
  return (h >>> 0).toString(36);
}

self.addEventListener('install', (event) => {
  event.waitUntil(
    caches.open(SHELL_CACHE).then((cache) =>
      // Hashed files come from the browser's HTTP cache (the page has just loaded them); the files
      // whose names stay the same (index.html, the icons) are fetched afresh.
      cache.addAll(
        shell.map(
          (entry) =>
            new Request(new URL(entry.url, self.location.href), {
              cache: entry.revision ? 'reload' : 'default',
            }),
        ),
      ),
    ),
  );
  void self.skipWaiting();
});

self.addEventListener('activate', (event) => {
  event.waitUntil(
    caches
      .keys()
      .then((names) =>
        Promise.all(
          names.filter((n) => n.startsWith('hilum-shell-') && n !== SHELL_CACHE).map((n) => caches.delete(n)),
        ),
      )
      .then(() => self.clients.claim()),
  );
});

/** A 200 kept under the request's address in `cacheName`, the response itself passed on. */
async function keep(cacheName: string, request: Request, response: Response): Promise<Response> {
  if (response.status === 200) {
    const cache = await caches.open(cacheName);
    await cache.put(request, response.clone());
  }
  return response;
}

/** The network's answer, unless it takes longer than `ms` and `fallback` has one. */
async function networkFirst(request: Request, ms: number, fallback: () => Promise<Response | undefined>) {
  const network = fetch(request);
  const slow = new Promise<'slow'>((resolve) => setTimeout(() => resolve('slow'), ms));
  try {
    const first = await Promise.race([network, slow]);
    if (first !== 'slow') return first;
    return (await fallback()) ?? (await network);
  } catch (error) {
    const kept = await fallback();
    if (kept) return kept;
    throw error;
  }
}

self.addEventListener('fetch', (event) => {
  const { request } = event;
  if (request.method !== 'GET') return;
  const url = new URL(request.url);
  if (url.origin !== self.location.origin) return;

  if (request.mode === 'navigate') {
    if (/^\/(api|dev|p)\//.test(url.pathname)) return;
    // The network's index.html when it answers soon (a new release is picked up at once), else the
    // kept shell, which routes to the page itself.
    event.respondWith(
      networkFirst(request, NAVIGATION_WAIT_MS, () => caches.match(INDEX, { cacheName: SHELL_CACHE })).then(
        async (response) => (response.status >= 500 ? ((await caches.match(INDEX)) ?? response) : response),
      ),
    );
    return;
  }

  if (url.pathname.startsWith('/assets/')) {
    event.respondWith(
      caches
        .match(request)
        .then((kept) => kept ?? fetch(request).then((response) => keep(ASSETS_CACHE, request, response))),
    );
    return;
  }

  // The JSON reads of the API (apiFetch asks for JSON); not sign-in, health, photos, files or feeds.
  if (
    url.pathname.startsWith('/api/') &&
    !url.pathname.startsWith('/api/auth/') &&
    url.pathname !== '/api/health' &&
    (request.headers.get('Accept') ?? '').includes('application/json')
  ) {
    event.respondWith(
      networkFirst(request, API_WAIT_MS, () => caches.match(request, { cacheName: API_CACHE })).then(
        (response) => keep(API_CACHE, request, response),
      ),
    );
  }
});

// The built files a page loaded before this worker took it over, which it would otherwise miss:
// fetched again (from the browser's HTTP cache: they are immutable) into the files' cache.
self.addEventListener('message', (event) => {
  const data = event.data as { type?: unknown; urls?: unknown } | null;
  if (data?.type !== CACHE_ASSETS_MESSAGE || !Array.isArray(data.urls)) return;
  const urls = data.urls
    .filter((u): u is string => typeof u === 'string')
    .map((u) => new URL(u, self.location.href))
    .filter((u) => u.origin === self.location.origin && u.pathname.startsWith('/assets/'));
  event.waitUntil(
    caches.open(ASSETS_CACHE).then(async (cache) => {
      for (const url of urls) {
        if (await caches.match(url.href)) continue;
        const response = await fetch(url.href).catch(() => null);
        if (response?.status === 200) await cache.put(url.href, response);
      }
    }),
  );
});
