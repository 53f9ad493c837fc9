import crypto from 'node:crypto';
import { SignJWT, jwtVerify } from 'jose';
import type { Clock } from '../clock';

export const SESSION_COOKIE = 'hilum_session';
export const SESSION_DAYS = 30;

export interface SessionSigner {
  sign(sessionId: string, expiresAt: Date): Promise<string>;
  /** The session id the token names, or null when it is forged, expired or malformed. */
  verify(token: string): Promise<string | null>;
}

/** How many verified tokens a signer remembers (a few hundred bytes each). */
const VERIFIED_CACHE_SIZE = 10_000;

export function createSessionSigner(secret: string, clock: Clock): SessionSigner {
  const key = new TextEncoder().encode(secret);
  // A token's signature and claims never change, so a token that verified once is remembered with
  // its expiry, and checked again only against the clock: the signature check (an asynchronous
  // WebCrypto job) is not repeated on every request. Only tokens that passed are kept; the session
  // row is still read on every request, so revoking a session still ends it at once.
  const verified = new Map<string, { sessionId: string; exp: number }>();
  const nowSeconds = () => Math.floor(clock.now().getTime() / 1000);
  return {
    sign: (sessionId, expiresAt) =>
      new SignJWT({})
        .setProtectedHeader({ alg: 'HS256' })
        .setSubject(sessionId)
        .setIssuedAt(clock.now())
        .setExpirationTime(expiresAt)
        .setIssuer('hilum')
        .sign(key),
    async verify(token) {
      const known = verified.get(token);
      if (known) return known.exp > nowSeconds() ? known.sessionId : null;
      try {
        const { payload } = await jwtVerify(token, key, {
          issuer: 'hilum',
          algorithms: ['HS256'],
          currentDate: clock.now(),
          requiredClaims: ['exp', 'sub'],
        });
        if (typeof payload.sub !== 'string' || typeof payload.exp !== 'number') return null;
        if (verified.size >= VERIFIED_CACHE_SIZE) verified.delete(verified.keys().next().value!);
        verified.set(token, { sessionId: payload.sub, exp: payload.exp });
        return payload.sub;
      } catch {
        return null;
      }
    },
  };
}

/** A random one-time token for an e-mailed link, and the hash that is stored in its place. */
export function newLinkToken(): { token: string; hash: string } {
  const token = crypto.randomBytes(32).toString('base64url');
  return { token, hash: hashLinkToken(token) };
}

export function hashLinkToken(token: string): string {
  return crypto.createHash('sha256').update(token).digest('hex');
}

/** A keyed link token as keyedLinkTokens makes it: 32 bytes of HMAC-SHA256 in base64url. */
const KEYED_TOKEN = /^[A-Za-z0-9_-]{43}$/;

/**
 * Tokens for a cookie-free link that can be shown again (a calendar feed, a lot's packet page):
 * the token is an HMAC, under the server's secret, of a stored random nonce, and only the token's
 * hash is stored to find the link by. The database alone does not give a token away; drawing a
 * new nonce retires the old token. `purpose` keeps one kind of link's tokens from opening another.
 */
export function keyedLinkTokens(secret: string, purpose: string) {
  const tokenOf = (nonce: string) =>
    crypto.createHmac('sha256', secret).update(`${purpose}:${nonce}`).digest('base64url');
  return {
    tokenOf,
    /** A new nonce and the hash of the token it gives, to store. */
    fresh(): { nonce: string; token_hash: string } {
      const nonce = crypto.randomBytes(32).toString('base64url');
      return { nonce, token_hash: hashLinkToken(tokenOf(nonce)) };
    },
    /** The stored hash to look a token up by, or null for text that is no such token at all. */
    hashOf: (token: string): string | null => (KEYED_TOKEN.test(token) ? hashLinkToken(token) : null),
  };
}
