import { clearMemberCaches } from './offline-caches';
import { clearWrites } from './write-queue';

/**
 * What one member leaves on this device, gone when they sign out, so the next person to sign in
 * here finds nothing of theirs: the writes waiting to send, the API answers kept for offline use,
 * and the numbers typed but not saved (localStorage keys under `hilum.`).
 */
export async function forgetMemberData(): Promise<void> {
  try {
    const keys = Array.from({ length: localStorage.length }, (_, i) => localStorage.key(i));
    for (const key of keys) if (key?.startsWith('hilum.')) localStorage.removeItem(key);
  } catch {
    // storage blocked: nothing was kept there
  }
  await Promise.all([clearWrites(), clearMemberCaches()]);
}
