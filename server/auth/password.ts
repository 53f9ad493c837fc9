import crypto from 'node:crypto';
import argon2 from 'argon2';

/** How the app hashes and checks passwords; createApp takes one (tests pass a cheap one). */
export interface PasswordHasher {
  hash(password: string): Promise<string>;
  verify(hash: string, password: string): Promise<boolean>;
}

// argon2id with the library's defaults (64 MiB, 3 passes, 4 lanes), which meet OWASP's guidance.
export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, { type: argon2.argon2id });
}

/** Checks against any argon2 hash: the hash carries its own variant and cost. */
export async function verifyPassword(hash: string, password: string): Promise<boolean> {
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}

/** The production hasher: argon2id at full strength. */
export const argon2idHasher: PasswordHasher = { hash: hashPassword, verify: verifyPassword };

/**
 * A hash of a random string made by `hasher` when first asked for (not at import), so that signing in
 * with an unknown e-mail costs the same time as a wrong password.
 */
export function lazyDecoyHash(hasher: PasswordHasher): () => Promise<string> {
  let decoy: Promise<string> | undefined;
  return () => {
    decoy ??= hasher.hash(`decoy-${crypto.randomUUID()}`).catch((error: unknown) => {
      decoy = undefined;
      throw error;
    });
    return decoy;
  };
}
