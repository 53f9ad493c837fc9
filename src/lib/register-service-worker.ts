import { CACHE_ASSETS_MESSAGE } from './offline-caches';

/**
 * Registers the service worker (/sw.js, the built app only) once the page has loaded, so it never
 * competes with the first visit's own downloads; then hands it the built files this page loaded
 * before it took over, so those open without a network too.
 */
export function registerServiceWorker(): void {
  if (!import.meta.env.PROD || !('serviceWorker' in navigator)) return;
  const register = async () => {
    try {
      await navigator.serviceWorker.register('/sw.js', { scope: '/' });
      const ready = await navigator.serviceWorker.ready;
      const urls = performance
        .getEntriesByType('resource')
        .map((entry) => entry.name)
        .filter((name) => new URL(name).pathname.startsWith('/assets/'));
      ready.active?.postMessage({ type: CACHE_ASSETS_MESSAGE, urls });
    } catch {
      // No service worker (a private window, storage refused): the app works, only not offline.
    }
  };
  if (document.readyState === 'complete') void register();
  else window.addEventListener('load', () => void register(), { once: true });
}
