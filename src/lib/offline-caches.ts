/*
 * The caches the service worker (src/service-worker/sw.ts) keeps, named in one place for both sides.
 * The app shell and the built files hold nothing of anyone's; the API answers are one member's
 * data, kept only so pages already visited open without a network, and dropped whenever that
 * member's session ends on this device.
 */

/** The built scripts, styles and fonts of the pages visited (content-hashed: never stale). */
export const ASSETS_CACHE = 'hilum-assets';
/** The API reads the pages visited made, as last answered: one member's data. */
export const API_CACHE = 'hilum-api';
/** The message a page sends the service worker with the built files it loaded before it took over. */
export const CACHE_ASSETS_MESSAGE = 'hilum:cache-assets';

/** Drops the member's cached API answers (signing out, a session ended elsewhere, a new sign-in). */
export async function clearMemberCaches(): Promise<void> {
  if (typeof caches === 'undefined') return;
  await caches.delete(API_CACHE);
}
