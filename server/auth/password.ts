import argon2 from 'argon2';

// argon2id with the library's defaults (64 MiB, 3 passes, 4 lanes), which meet OWASP's guidance.
export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, { type: argon2.argon2id });
}

export async function verifyPassword(hash: string, password: string): Promise<boolean> {
  try {
    return await argon2.verify(hash, password);
  } catch {
    return false;
  }
}
