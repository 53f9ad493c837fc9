/**
 * Where to go after signing in: only a path on this site. Anything else (another host, a
 * protocol-relative `//host`, a backslash trick, the sign-in pages themselves) falls back.
 */
export function safeNext(next: string | null | undefined, fallback = '/'): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return fallback;
  try {
    const base = 'http://hilum.invalid';
    const url = new URL(next, base);
    if (url.origin !== base) return fallback;
    if (url.pathname === '/sign-in' || url.pathname === '/sign-up') return fallback;
    return url.pathname + url.search + url.hash;
  } catch {
    return fallback;
  }
}
