import { DAY_MS } from '#shared/dates';
import type { LoginBody, RegisterBody } from '#shared/schemas/accounts';
import { argon2idHasher, lazyDecoyHash, type PasswordHasher } from '#server/auth/password';
import { SESSION_DAYS, hashLinkToken, newLinkToken, type SessionSigner } from '#server/auth/tokens';
import type { Clock } from '#server/clock';
import type { Db } from '#server/db/database';
import { AppError, conflict, unauthorized } from '#server/http/errors';
import type { Mailer } from '#server/mail/mailer';
import * as users from './users.repository';

const RESET_VALID_MS = 60 * 60 * 1000;

export interface AuthServiceDeps {
  db: Db;
  clock: Clock;
  signer: SessionSigner;
  mailer: Mailer;
  appOrigin: string;
  /** argon2id at full strength unless given (API tests pass a cheap one). */
  hasher?: PasswordHasher;
}

export function createAuthService({
  db,
  clock,
  signer,
  mailer,
  appOrigin,
  hasher = argon2idHasher,
}: AuthServiceDeps) {
  // A hash of a random string by the same hasher, so an unknown e-mail costs the same time as a wrong password.
  const decoyHash = lazyDecoyHash(hasher);

  async function startSession(userId: string, userAgent: string | null) {
    const now = clock.now();
    const expiresAt = new Date(now.getTime() + SESSION_DAYS * DAY_MS);
    const { id } = await users.insertSession(db, { userId, expiresAt, userAgent, now });
    return { token: await signer.sign(id, expiresAt), expiresAt };
  }

  return {
    async register(body: RegisterBody, userAgent: string | null) {
      if (await users.findUserByEmail(db, body.email)) {
        throw conflict('An account with that e-mail address already exists.', 'email_taken');
      }
      const passwordHash = await hasher.hash(body.password);
      let user;
      try {
        user = await users.insertUser(db, { email: body.email, name: body.name, passwordHash });
      } catch (error) {
        // Two sign-ups racing for one address: the unique index decides.
        if ((error as { code?: string }).code === '23505') {
          throw conflict('An account with that e-mail address already exists.', 'email_taken');
        }
        throw error;
      }
      return { user, session: await startSession(user.id, userAgent) };
    },

    async login(body: LoginBody, userAgent: string | null) {
      const found = await users.findUserByEmail(db, body.email);
      const ok = await hasher.verify(found?.password_hash ?? (await decoyHash()), body.password);
      if (!found || !ok) throw unauthorized('That e-mail and password do not match an account.');
      const user = { id: found.id, email: found.email, name: found.name };
      return { user, session: await startSession(found.id, userAgent) };
    },

    logout: (sessionId: string) => users.deleteSession(db, sessionId),
    logoutEverywhere: (userId: string) => users.deleteUserSessions(db, userId),

    async me(userId: string) {
      const user = await users.findUserById(db, userId);
      if (!user) throw unauthorized();
      return { user, memberships: await users.membershipsOf(db, userId) };
    },

    /** Always resolves the same way, whether or not the e-mail has an account. */
    async requestPasswordReset(email: string) {
      const user = await users.findUserByEmail(db, email);
      if (!user) return;
      const now = clock.now();
      const { token, hash } = newLinkToken();
      await users.insertPasswordReset(db, {
        userId: user.id,
        tokenHash: hash,
        expiresAt: new Date(now.getTime() + RESET_VALID_MS),
        now,
      });
      const link = `${appOrigin}/reset-password?token=${token}`;
      // A mail failure is logged by the caller but never changes the answer (no account enumeration).
      await mailer.send({
        to: user.email,
        subject: 'Reset your Hilum password',
        text: [
          `Hello ${user.name},`,
          '',
          'Someone (we hope you) asked to reset the password of your Hilum account.',
          'Open this link within one hour to choose a new password. It works once:',
          '',
          link,
          '',
          'If you did not ask for this, ignore this message; your password stays as it is.',
        ].join('\n'),
      });
    },

    async confirmPasswordReset(token: string, password: string) {
      const passwordHash = await hasher.hash(password);
      await db.transaction().execute(async (trx) => {
        const now = clock.now();
        const reset = await users.consumePasswordReset(trx, hashLinkToken(token), now);
        if (!reset) {
          throw new AppError(
            400,
            'invalid_token',
            'This reset link has expired or was already used. Ask for a new one.',
          );
        }
        await users.setPassword(trx, reset.user_id, passwordHash, now);
        await users.deleteUserSessions(trx, reset.user_id);
      });
    },
  };
}

export type AuthService = ReturnType<typeof createAuthService>;
