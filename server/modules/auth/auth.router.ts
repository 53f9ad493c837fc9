import { Router, type CookieOptions, type Response } from 'express';
import {
  loginBodySchema,
  meResponseSchema,
  passwordResetBodySchema,
  passwordResetConfirmBodySchema,
  registerBodySchema,
  userSchema,
  verifyEmailBodySchema,
} from '#shared/schemas/accounts';
import { z } from 'zod';
import { DAY_MS } from '#shared/dates';
import { requireAuth } from '#server/auth/session.middleware';
import { SESSION_COOKIE, SESSION_DAYS } from '#server/auth/tokens';
import { parse } from '#server/http/errors';
import type { AuthLimits } from '#server/http/rate-limit';
import { respond } from '#server/http/respond';
import type { AuthService } from './auth.service';
import { authOf } from '#server/http/request-context';

const userResponse = z.object({ user: userSchema });

export function authRouter(
  service: AuthService,
  options: { secureCookies: boolean; limits: AuthLimits },
): Router {
  const { limits } = options;
  const router = Router();
  const cookie: CookieOptions = {
    httpOnly: true,
    sameSite: 'lax',
    secure: options.secureCookies,
    path: '/',
  };
  // Max-Age rather than Expires: the browser's clock decides, and the session row is the authority.
  const setSession = (res: Response, session: { token: string }) =>
    res.cookie(SESSION_COOKIE, session.token, { ...cookie, maxAge: SESSION_DAYS * DAY_MS });

  router.post('/register', limits.signUp, async (req, res) => {
    const body = parse(registerBodySchema, req.body, 'sign-up');
    const { user, session } = await service.register(body, req.get('user-agent') ?? null);
    setSession(res, session);
    respond(res, 201, userResponse, { user });
  });

  router.post('/login', limits.signIn, async (req, res) => {
    const body = parse(loginBodySchema, req.body, 'sign-in');
    const { user, session } = await service.login(body, req.get('user-agent') ?? null);
    setSession(res, session);
    respond(res, 200, userResponse, { user });
  });

  router.post('/logout', async (req, res) => {
    if (req.auth) await service.logout(req.auth.sessionId);
    res.clearCookie(SESSION_COOKIE, cookie);
    res.status(204).end();
  });

  router.post('/logout-all', requireAuth, async (req, res) => {
    await service.logoutEverywhere(authOf(req).userId);
    res.clearCookie(SESSION_COOKIE, cookie);
    res.status(204).end();
  });

  router.post('/password-reset', limits.resetRequest, async (req, res) => {
    const { email } = parse(passwordResetBodySchema, req.body, 'reset request');
    // Queued, not sent: the answer comes at once, the same whether or not the address has an account.
    await service.requestPasswordReset(email);
    res.status(202).json({ ok: true });
  });

  router.post('/password-reset/confirm', limits.resetConfirm, async (req, res) => {
    const { token, password } = parse(passwordResetConfirmBodySchema, req.body, 'new password');
    await service.confirmPasswordReset(token, password);
    res.clearCookie(SESSION_COOKIE, cookie);
    res.status(204).end();
  });

  router.post('/verify-email', async (req, res) => {
    const { token } = parse(verifyEmailBodySchema, req.body, 'confirmation link');
    respond(res, 200, userResponse, { user: await service.verifyEmail(token) });
  });

  router.post('/verify-email/resend', requireAuth, async (req, res) => {
    await service.resendVerification(authOf(req).userId);
    res.status(202).json({ ok: true });
  });

  return router;
}

export function meRouter(service: AuthService): Router {
  const router = Router();
  router.get('/', requireAuth, async (req, res) => {
    respond(res, 200, meResponseSchema, await service.me(authOf(req).userId));
  });
  return router;
}
