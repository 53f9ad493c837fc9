import crypto from 'node:crypto';
import type { RequestHandler, Response } from 'express';
import type { Logger } from 'pino';
import type { Clock } from '../clock';
import type { Db } from '../db/database';
import { claimIdempotencyKey, recordIdempotentAnswer, releaseIdempotencyKey } from '../db/idempotency-keys';
import { AppError } from './errors';

/** The request header a client sends a write's key in (as the IETF draft on it names it). */
export const IDEMPOTENCY_HEADER = 'Idempotency-Key';
/** Marks an answer that is the kept first answer of an earlier request with the same key. */
export const REPLAYED_HEADER = 'Idempotent-Replayed';

const KEY = /^[A-Za-z0-9_-]{16,100}$/;
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
/** A claim this old whose request never answered lost its server; the same request may take it over. */
const STALE_MS = 2 * 60_000;
/** How long a key's answer is kept: far longer than any retry of a queued write takes. */
const KEEP_MS = 7 * 24 * 60 * 60_000;

const sha256 = (text: string) => crypto.createHash('sha256').update(text).digest('hex');

/**
 * Makes a repeated write harmless. A signed-in member's state-changing request that carries an
 * Idempotency-Key runs once; the same key again (a phone's queue sending a write whose answer it
 * never got, two tabs sending one queue) gets the first answer — status and body, marked with
 * Idempotent-Replayed — without running again. Keys are per member. A key reused for another
 * write is 422; one whose first request is still running is 409 with Retry-After. A first answer
 * of 5xx is not kept (the write did not happen, so it may be sent again); 2xx and 4xx are.
 * Requests without the header, and signed-out ones, pass as they are.
 */
export function idempotentWrites(db: Db, clock: Clock, logger: Logger): RequestHandler {
  return async (req, res, next) => {
    const key = req.get(IDEMPOTENCY_HEADER);
    if (key === undefined || SAFE_METHODS.has(req.method)) return next();
    if (!KEY.test(key)) {
      return next(
        new AppError(
          400,
          'invalid_input',
          `The ${IDEMPOTENCY_HEADER} header must be 16 to 100 letters, digits, "-" or "_" (a random UUID will do).`,
          { [IDEMPOTENCY_HEADER]: 'Send 16 to 100 letters, digits, "-" or "_".' },
        ),
      );
    }
    if (!req.auth) return next(); // the route answers 401; there is nobody to keep it for
    const at = { userId: req.auth.userId, key };
    const requestHash = sha256(`${req.method} ${req.originalUrl}\n${JSON.stringify(req.body ?? null)}`);
    const now = clock.now();
    try {
      const claim = await claimIdempotencyKey(db, {
        ...at,
        requestHash,
        now,
        staleBefore: new Date(now.getTime() - STALE_MS),
        sweepBefore: new Date(now.getTime() - KEEP_MS),
      });
      if (claim.kind !== 'claimed' && claim.requestHash !== requestHash) {
        throw new AppError(
          422,
          'idempotency_key_reused',
          `This ${IDEMPOTENCY_HEADER} was already used for a different request; send a new key for a new write.`,
        );
      }
      if (claim.kind === 'running') {
        res.setHeader('Retry-After', '2');
        throw new AppError(
          409,
          'request_in_progress',
          'The same write is still being saved; try again in a moment.',
        );
      }
      if (claim.kind === 'done') {
        res.status(claim.status).setHeader(REPLAYED_HEADER, 'true');
        if (claim.body === null) res.end();
        else res.json(claim.body);
        return;
      }
    } catch (error) {
      return next(error);
    }
    keepFirstAnswer(res, db, at, logger);
    next();
  };
}

/**
 * Keeps the answer of a claimed request before it leaves (so a repeat that arrives as soon as the
 * client has it finds it kept), or gives the claim back when the server failed. A client that hung
 * up early does not release it: the write may still be running, and its answer is kept for the
 * repeat.
 */
function keepFirstAnswer(res: Response, db: Db, at: { userId: string; key: string }, logger: Logger) {
  let settled = false;
  const release = () => {
    if (settled) return;
    settled = true;
    releaseIdempotencyKey(db, at).catch((error: unknown) =>
      logger.warn({ err: error }, 'could not release an idempotency key'),
    );
  };
  const json = res.json.bind(res);
  res.json = ((body?: unknown) => {
    if (settled || res.statusCode >= 500) return json(body);
    settled = true;
    recordIdempotentAnswer(db, at, res.statusCode, body === undefined ? null : JSON.stringify(body))
      .catch((error: unknown) => logger.warn({ err: error }, 'could not keep an idempotent answer'))
      .finally(() => json(body));
    return res;
  }) as Response['json'];
  res.on('finish', () => {
    if (settled) return;
    if (res.statusCode >= 500) return release();
    // An answer without a JSON body (a 204): kept as its status alone.
    settled = true;
    recordIdempotentAnswer(db, at, res.statusCode, null).catch((error: unknown) =>
      logger.warn({ err: error }, 'could not keep an idempotent answer'),
    );
  });
}
