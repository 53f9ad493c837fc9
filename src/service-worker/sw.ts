// The service worker (built by vite-plugin-pwa's injectManifest into /sw.js): the app opens without
// a network on the pages already visited. Precached: the app shell (index.html, the entry script
// and what it preloads, the stylesheet, the icons) — nothing more, so installing it costs a slow
// phone nothing it had not already fetched. Kept as used: each page's built files (cache first:
// their names change with their content) and the API reads the pages made (network first; the
// last answer when there is no network). Writes are never touched: the page's own queue keeps
// and sends them (src/lib/write-queue.ts).
import {
  cleanupOutdatedCaches,
  matchPrecache,
  precacheAndRoute,
  type PrecacheEntry,
} from 'workbox-precaching';
import { NavigationRoute, registerRoute } from 'workbox-routing';
import { CacheFirst, NetworkFirst } from 'workbox-strategies';
import { CacheableResponsePlugin } from 'workbox-cacheable-response';
import { API_CACHE, ASSETS_CACHE, CACHE_ASSETS_MESSAGE } from '#src/lib/offline-caches';

interface ExtendableEvent extends Event {
  waitUntil(promise: Promise<unknown>): void;
}
interface ServiceWorkerScope {
  __WB_MANIFEST: Array<PrecacheEntry | string>;
  location: Location;
  skipWaiting(): Promise<void>;
  clients: { claim(): Promise<void> };
  addEventListener(type: 'install' | 'activate', listener: (event: ExtendableEvent) => void): void;
  addEventListener(type: 'message', listener: (event: ExtendableEvent & MessageEvent) => void): void;
}
declare const self: ServiceWorkerScope;

precacheAndRoute(self.__WB_MANIFEST);
cleanupOutdatedCaches();

const sameOrigin = (url: URL) => url.origin === self.location.origin;
const onlyWhole = () => new CacheableResponsePlugin({ statuses: [200] });

// A page opened by address: the network's index.html when it answers within a few seconds (a new
// release is picked up at once), else the precached shell, which routes to the page itself.
const NAVIGATION_WAIT_MS = 4000;
registerRoute(
  new NavigationRoute(
    async ({ request }) => {
      try {
        const response = await fetch(request, { signal: AbortSignal.timeout(NAVIGATION_WAIT_MS) });
        if (response.status < 500) return response;
      } catch {
        // No network, or too slow: the shell below.
      }
      return (await matchPrecache('/index.html')) ?? Response.error();
    },
    { denylist: [/^\/api\//, /^\/dev\//] },
  ),
);

const assets = new CacheFirst({ cacheName: ASSETS_CACHE, plugins: [onlyWhole()] });
registerRoute(({ url }) => sameOrigin(url) && url.pathname.startsWith('/assets/'), assets);

// The JSON reads of the API (apiFetch asks for JSON); not photos, files or feeds.
registerRoute(
  ({ url, request }) =>
    sameOrigin(url) &&
    url.pathname.startsWith('/api/') &&
    !url.pathname.startsWith('/api/auth/') &&
    url.pathname !== '/api/health' &&
    (request.headers.get('Accept') ?? '').includes('application/json'),
  new NetworkFirst({ cacheName: API_CACHE, networkTimeoutSeconds: 10, plugins: [onlyWhole()] }),
);

// The built files a page loaded before this worker took it over, which it would otherwise miss:
// fetched again through the cache-first route (from the browser's HTTP cache: they are immutable).
self.addEventListener('message', (event) => {
  const data = event.data as { type?: unknown; urls?: unknown } | null;
  if (data?.type !== CACHE_ASSETS_MESSAGE || !Array.isArray(data.urls)) return;
  const urls = data.urls
    .filter((u): u is string => typeof u === 'string')
    .map((u) => new URL(u, self.location.href))
    .filter((u) => sameOrigin(u) && u.pathname.startsWith('/assets/'));
  event.waitUntil(
    caches.open(ASSETS_CACHE).then(async (cache) => {
      for (const url of urls) {
        if (await cache.match(url.href)) continue;
        const response = await fetch(url.href).catch(() => null);
        if (response?.status === 200) await cache.put(url.href, response);
      }
    }),
  );
});

// A new release takes over at once: the shell and the files it names come from the same build.
self.addEventListener('install', () => void self.skipWaiting());
self.addEventListener('activate', (event) => event.waitUntil(self.clients.claim()));
