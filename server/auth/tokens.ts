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

export function createSessionSigner(secret: string, clock: Clock): SessionSigner {
  const key = new TextEncoder().encode(secret);
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
      try {
        const { payload } = await jwtVerify(token, key, {
          issuer: 'hilum',
          algorithms: ['HS256'],
          currentDate: clock.now(),
        });
        return typeof payload.sub === 'string' ? payload.sub : null;
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
