import { DAY_MS } from '#shared/dates';
import type { LoginBody, RegisterBody } from '#shared/schemas/accounts';
import { argon2idHasher, lazyDecoyHash, type PasswordHasher } from '#server/auth/password';
import { SESSION_DAYS, hashLinkToken, newLinkToken, type SessionSigner } from '#server/auth/tokens';
import type { Clock } from '#server/clock';
import type { Db, DbOrTx } from '#server/db/database';
import { AppError, conflict, unauthorized } from '#server/http/errors';
import type { MailQueue } from '#server/mail/mail-queue';
import * as users from './users.repository';

const RESET_VALID_MS = 60 * 60 * 1000;
const VERIFY_DAYS = 3;

const invalidResetLink = () =>
  new AppError(400, 'invalid_token', 'This reset link has expired or was already used. Ask for a new one.');

export interface AuthServiceDeps {
  db: Db;
  clock: Clock;
  signer: SessionSigner;
  mailQueue: MailQueue;
  appOrigin: string;
  /** argon2id at full strength unless given (API tests pass a cheap one). */
  hasher?: PasswordHasher;
}

export function createAuthService({
  db,
  clock,
  signer,
  mailQueue,
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

  /** Queues a link that proves the account's address, in the caller's transaction. */
  async function queueVerification(trx: DbOrTx, user: { id: string; email: string; name: string }) {
    const now = clock.now();
    const { token, hash } = newLinkToken();
    const expiresAt = new Date(now.getTime() + VERIFY_DAYS * DAY_MS);
    await users.insertEmailVerification(trx, {
      userId: user.id,
      email: user.email,
      tokenHash: hash,
      expiresAt,
      now,
    });
    await mailQueue.enqueue(trx, {
      kind: 'email_verification',
      to: user.email,
      expiresAt,
      subject: 'Confirm your e-mail address for Hilum',
      text: [
        `Hello ${user.name},`,
        '',
        `Please confirm that ${user.email} is your address by opening this link within ${VERIFY_DAYS} days:`,
        '',
        `${appOrigin}/verify-email?token=${token}`,
        '',
        'A confirmed address lets a seed bank’s owner make you an owner too. If you did not sign up for',
        'Hilum, ignore this message.',
      ].join('\n'),
    });
  }

  // A reset request only queues the address (the same work whether or not it has an account);
  // the queue's worker looks the account up and writes the link when it sends.
  mailQueue.prepareWith('password_reset', async (trx, email) => {
    const user = await users.findUserByEmail(trx, email);
    if (!user) return null;
    const now = clock.now();
    const { token, hash } = newLinkToken();
    await users.insertPasswordReset(trx, {
      userId: user.id,
      tokenHash: hash,
      expiresAt: new Date(now.getTime() + RESET_VALID_MS),
      now,
    });
    return {
      subject: 'Reset your Hilum password',
      text: [
        `Hello ${user.name},`,
        '',
        'Someone (we hope you) asked to reset the password of your Hilum account.',
        'Open this link within one hour to choose a new password. It works once:',
        '',
        `${appOrigin}/reset-password?token=${token}`,
        '',
        'If you did not ask for this, ignore this message; your password stays as it is.',
      ].join('\n'),
    };
  });

  return {
    /** Creates the account, signed in, and mails a link to confirm its address. */
    async register(body: RegisterBody, userAgent: string | null) {
      if (await users.findUserByEmail(db, body.email)) {
        throw conflict('An account with that e-mail address already exists.', 'email_taken');
      }
      const passwordHash = await hasher.hash(body.password);
      let user;
      try {
        user = await db.transaction().execute(async (trx) => {
          const row = await users.insertUser(trx, { email: body.email, name: body.name, passwordHash });
          await queueVerification(trx, row);
          return row;
        });
      } catch (error) {
        // Two sign-ups racing for one address: the unique index decides.
        if ((error as { code?: string }).code === '23505') {
          throw conflict('An account with that e-mail address already exists.', 'email_taken');
        }
        throw error;
      }
      mailQueue.kick();
      return { user: users.publicUser(user), session: await startSession(user.id, userAgent) };
    },

    async login(body: LoginBody, userAgent: string | null) {
      const found = await users.findUserByEmail(db, body.email);
      const ok = await hasher.verify(found?.password_hash ?? (await decoyHash()), body.password);
      if (!found || !ok) throw unauthorized('That e-mail and password do not match an account.');
      return { user: users.publicUser(found), session: await startSession(found.id, userAgent) };
    },

    logout: (sessionId: string) => users.deleteSession(db, sessionId),
    logoutEverywhere: (userId: string) => users.deleteUserSessions(db, userId),

    async me(userId: string) {
      const user = await users.findUserById(db, userId);
      if (!user) throw unauthorized();
      return { user: users.publicUser(user), memberships: await users.membershipsOf(db, userId) };
    },

    /** Mails a new confirmation link to the signed-in account's address. */
    async resendVerification(userId: string) {
      await db.transaction().execute(async (trx) => {
        const user = await users.findUserById(trx, userId);
        if (!user) throw unauthorized();
        if (user.email_verified_at) {
          throw conflict('Your e-mail address is already confirmed.', 'already_verified');
        }
        await queueVerification(trx, user);
      });
      mailQueue.kick();
    },

    /** Uses a confirmation link: the account proved the address the link was mailed to. */
    async verifyEmail(token: string) {
      const now = clock.now();
      return db.transaction().execute(async (trx) => {
        const link = await users.consumeEmailVerification(trx, hashLinkToken(token), now);
        if (!link) {
          throw new AppError(
            400,
            'invalid_token',
            'This confirmation link has expired or was already used. Sign in and ask for a new one from the account menu.',
          );
        }
        await users.markEmailVerified(trx, link.user_id, link.email, now);
        const user = await users.findUserById(trx, link.user_id);
        if (!user) throw unauthorized();
        return users.publicUser(user);
      });
    },

    /**
     * Queues the request and answers: the same one insert whether or not the address has an
     * account, and no mail server in the request. The queue's worker writes the link, if any.
     */
    async requestPasswordReset(email: string) {
      await mailQueue.enqueue(db, {
        kind: 'password_reset',
        to: email,
        expiresAt: new Date(clock.now().getTime() + RESET_VALID_MS),
      });
      mailQueue.kick();
    },

    /**
     * The token is checked before the password is hashed, so a bogus token costs no hashing. Using
     * a link ends every other unused link of the account and every session; it also proves the
     * address the link was mailed to.
     */
    async confirmPasswordReset(token: string, password: string) {
      const tokenHash = hashLinkToken(token);
      if (!(await users.findOpenPasswordReset(db, tokenHash, clock.now()))) throw invalidResetLink();
      const passwordHash = await hasher.hash(password);
      await db.transaction().execute(async (trx) => {
        const now = clock.now();
        const reset = await users.consumePasswordReset(trx, tokenHash, now);
        if (!reset) throw invalidResetLink();
        await users.setPassword(trx, reset.user_id, passwordHash, now);
        await users.closePasswordResets(trx, reset.user_id, now);
        await users.deleteUserSessions(trx, reset.user_id);
        const user = await users.findUserById(trx, reset.user_id);
        if (user) await users.markEmailVerified(trx, user.id, user.email, now);
      });
    },
  };
}

export type AuthService = ReturnType<typeof createAuthService>;
