import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { AppError } from './errors';

export interface LimitOptions {
  windowMs: number;
  limit: number;
  /** Count only failed attempts (a successful sign-in does not use up the allowance). */
  onlyFailures?: boolean;
}

function limiter(options: LimitOptions, key: (req: Request) => string): RequestHandler {
  return rateLimit({
    windowMs: options.windowMs,
    limit: options.limit,
    skipSuccessfulRequests: options.onlyFailures ?? false,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: key,
    handler: (_req, _res, next) =>
      next(new AppError(429, 'rate_limited', 'Too many attempts. Wait a few minutes and try again.')),
  });
}

/** Limits a route both per client address and per e-mail address named in the body. */
export function limitPerIpAndEmail(perIp: LimitOptions, perEmail: LimitOptions): RequestHandler[] {
  return [
    limiter(perIp, (req) => ipKeyGenerator(req.ip ?? 'unknown')),
    limiter(perEmail, (req) => {
      const email: unknown = (req.body as { email?: unknown } | undefined)?.email;
      return `email:${typeof email === 'string' ? email.trim().toLowerCase() : ''}`;
    }),
  ];
}
