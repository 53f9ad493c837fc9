import crypto from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import { ipKeyGenerator } from 'express-rate-limit';
import type { Logger } from 'pino';
import { emailSchema } from '#shared/schemas/accounts';
import type { Clock } from '#server/clock';
import type { Db } from '#server/db/database';
import { countAttempts, sweepEndedCounters, uncountAttempts } from '#server/db/rate-limits';
import { AppError } from './errors';

const MINUTE = 60_000;
const HOUR = 60 * MINUTE;
/** How often one server forgets counters whose window has ended. */
const SWEEP_EVERY_MS = 10 * MINUTE;

export interface Limit {
  /** Names the counter: with what `key` returns, it is one row of `rate_limits`. */
  name: string;
  windowMs: number;
  /** Attempts allowed in a window; the next one is answered 429 until the window ends. */
  limit: number;
  /** Count only failed attempts: an attempt answered below 400 is taken back before it leaves. */
  onlyFailures?: boolean;
  /** What is counted: the client's address, an e-mail, the two together. */
  key(req: Request): string;
}

/**
 * The client's address, as Express's `trust proxy` setting (TRUST_PROXY) lets it be read: the
 * socket's peer unless that peer is a trusted proxy. An IPv6 client counts by its /56, which one
 * household usually holds whole.
 */
export const clientAddress = (req: Request): string =>
  ipKeyGenerator(req.ip ?? req.socket.remoteAddress ?? 'unknown');

/** The e-mail named in the body, as the schemas normalise it; '' when there is none. */
function emailOf(req: Request): string {
  const email: unknown = (req.body as { email?: unknown } | undefined)?.email;
  const parsed = emailSchema.safeParse(email);
  return parsed.success ? parsed.data : '';
}

const sha256 = (text: string) => crypto.createHash('sha256').update(text).digest('hex');

export interface RateLimiterDeps {
  db: Db;
  clock: Clock;
  logger: Logger;
}

/**
 * Rate limits counted in PostgreSQL (table `rate_limits`), so every app server on the database
 * counts into the same windows. Each attempt is counted before the route runs (parallel attempts
 * cannot slip past the count); for limits on failures only, a successful attempt is taken back
 * before its answer leaves, so the client's next request already sees the count without it.
 */
export function createRateLimiter({ db, clock, logger }: RateLimiterDeps) {
  let lastSweep = Number.NEGATIVE_INFINITY;

  return function limit(...limits: Limit[]): RequestHandler {
    return async (req, res, next) => {
      const now = clock.now();
      if (now.getTime() - lastSweep >= SWEEP_EVERY_MS) {
        lastSweep = now.getTime();
        await sweepEndedCounters(db, now);
      }
      // Only a hash is stored: the table holds no e-mail or address, and no key is too long to index.
      const keyed = limits.map((l) => ({ limit: l, key: sha256(`${l.name}\n${l.key(req)}`) }));
      const counted = new Map(
        (
          await countAttempts(
            db,
            keyed.map((k) => ({ key: k.key, windowMs: k.limit.windowMs })),
            now,
          )
        ).map((c) => [c.key, c]),
      );
      const failuresOnly = keyed.filter((k) => k.limit.onlyFailures).map((k) => counted.get(k.key)!);
      if (failuresOnly.length) takeBackOnSuccess(res, () => uncountAttempts(db, failuresOnly), logger);

      const over = keyed.filter((k) => counted.get(k.key)!.hits > k.limit.limit);
      if (over.length === 0) return next();
      const until = Math.max(...over.map((k) => counted.get(k.key)!.resetAt.getTime()));
      const seconds = Math.max(1, Math.ceil((until - now.getTime()) / 1000));
      res.setHeader('Retry-After', String(seconds));
      throw new AppError(429, 'rate_limited', `Too many attempts. Try again in ${waitWords(seconds)}.`);
    };
  };
}

function waitWords(seconds: number): string {
  if (seconds < 60) return `${seconds} second${seconds === 1 ? '' : 's'}`;
  const minutes = Math.ceil(seconds / 60);
  return `${minutes} minute${minutes === 1 ? '' : 's'}`;
}

/**
 * Holds a successful answer (status below 400) until `takeBack` has run: the same trick as
 * forgetOnWrites (server/db/read-cache.ts) of acting before the answer leaves, here with a wait,
 * so the count is right by the time the client can send again.
 */
function takeBackOnSuccess(res: Response, takeBack: () => Promise<void>, logger: Logger) {
  const end = res.end;
  res.end = function (this: Response, ...args: unknown[]) {
    res.end = end;
    if (res.statusCode >= 400) return end.apply(this, args as Parameters<typeof end>);
    takeBack()
      .catch((error: unknown) => logger.warn({ err: error }, 'a rate-limit count was not taken back'))
      .finally(() => end.apply(this, args as Parameters<typeof end>));
    return this;
  } as typeof end;
}

const byAddress = (name: string, windowMs: number, limit: number, onlyFailures = false): Limit => ({
  name: `${name} per address`,
  windowMs,
  limit,
  onlyFailures,
  key: clientAddress,
});

export const SIGN_UPS_PER_HOUR = 100;

/** The limits on the routes that take a password or a link's token without a session. */
export interface AuthLimits {
  signIn: RequestHandler;
  signUp: RequestHandler;
  resetRequest: RequestHandler;
  resetConfirm: RequestHandler;
}

/**
 * Hilum's limits on signing in and the routes around it [common practice; the numbers are ours]:
 * - sign-in: 5 failures in 15 minutes per account *from one address* (another address, such as the
 *   owner's own, is not locked out by them), and 50 failures per address across all accounts
 *   (against one address trying a password on many accounts);
 * - sign-up: 100 an hour per address (a workshop behind one router signs up together; each one
 *   costs a full argon2 hash);
 * - reset request: 20 an hour per address and 3 an hour per e-mail (each one sends a mail);
 * - reset confirm: 20 in 15 minutes per address.
 */
export function authRateLimits(
  limit: ReturnType<typeof createRateLimiter>,
  { signUpLimit = SIGN_UPS_PER_HOUR }: { signUpLimit?: number | undefined } = {},
): AuthLimits {
  return {
    signIn: limit(byAddress('sign-in', 15 * MINUTE, 50, true), {
      name: 'sign-in per account and address',
      windowMs: 15 * MINUTE,
      limit: 5,
      onlyFailures: true,
      key: (req) => `${emailOf(req)}\n${clientAddress(req)}`,
    }),
    signUp: limit(byAddress('sign-up', HOUR, signUpLimit)),
    resetRequest: limit(byAddress('reset request', HOUR, 20), {
      name: 'reset request per e-mail',
      windowMs: HOUR,
      limit: 3,
      key: emailOf,
    }),
    resetConfirm: limit(byAddress('reset confirm', 15 * MINUTE, 20)),
  };
}
