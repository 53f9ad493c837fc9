import type { QueryClient } from '@tanstack/react-query';
import { paths } from '../config/paths';
import { authKeys } from '../features/auth/api/keys';
import { clearMemberCaches } from '../lib/offline-caches';

/** Why the sign-in page was opened, carried in the router's location state. */
export type SignInReason = 'session-ended' | 'signed-out' | 'password-changed';
export interface SignInState {
  reason?: SignInReason;
}

type Navigate = (href: string, state: SignInState) => void;
let navigateTo: Navigate | null = null;

/** The router registers how to move to the sign-in page (it exists only after the provider). */
export function registerSignInNavigator(navigate: Navigate): () => void {
  navigateTo = navigate;
  return () => {
    if (navigateTo === navigate) navigateTo = null;
  };
}

/**
 * A request answered 401. If the person was signed in (the cache still holds who they are), their
 * session ended elsewhere — signed out on another device, or a password reset — so drop everything
 * cached for them and send them to sign in, coming back here afterwards. Signed-out 401s (a wrong
 * password, the first /api/me) are left to the page that asked.
 */
export function handleUnauthenticated(queryClient: QueryClient): void {
  if (queryClient.getQueryData(authKeys.me()) === undefined) return;
  const here = window.location.pathname + window.location.search;
  if (window.location.pathname === paths.signIn.path) return;
  // Out of the cache's own error callback before clearing it.
  queueMicrotask(() => {
    // Several requests may fail together; the first one through clears the cache, the rest stop here.
    if (queryClient.getQueryData(authKeys.me()) === undefined) return;
    queryClient.clear();
    // The answers kept for offline use go too; writes waiting to send stay for this member's next
    // sign-in here (they are sent only with their own session) unless someone signs out.
    void clearMemberCaches();
    const href = paths.signIn.getHref(here);
    if (navigateTo) navigateTo(href, { reason: 'session-ended' });
    else window.location.assign(href);
  });
}
