import crypto from 'node:crypto';
import express from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '#server/app';
import { loadConfig } from '#server/config';
import { errorHandler } from '#server/http/errors';
import { requestLogging } from '#server/http/request-log';
import { readOutbox } from '#server/mail/outbox';
import { createTestContext, type TestContext } from '../helpers/context';
import { PASSWORD, uniqueEmail } from '../helpers/accounts';
import { capturedLogger } from '../helpers/captured-log';
import { linkIn, waitForMail } from '../helpers/outbox';

/** The session token a response sets, as the browser would keep it. */
function sessionToken(res: request.Response): string {
  const match = /hilum_session=([^;]+)/.exec(String(res.headers['set-cookie']));
  if (!match?.[1]) throw new Error(`no session cookie: ${res.status} ${JSON.stringify(res.body)}`);
  return match[1];
}

/** Every `token=` in the links of the mails sent to `address`. */
async function linkTokens(address: string): Promise<string[]> {
  const mails = (await readOutbox(process.env.OUTBOX_DIR!, 500)).filter((m) => m.to.includes(address));
  return mails.flatMap((m) => [...m.text.matchAll(/[?&]token=([\w-]+)/g)].map((found) => found[1]!));
}

describe('secrets in the production log', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(() => ctx.close());

  it('when people sign up, sign in, reset a password and accept an invitation, then no session token, link token or password is in the log', async () => {
    // As production runs: NODE_ENV=production at the default LOG_LEVEL, which logs every request.
    const production = loadConfig({
      DATABASE_URL: ctx.config.databaseUrl,
      NODE_ENV: 'production',
      SESSION_SECRET: crypto.randomBytes(32).toString('hex'),
    });
    expect(production.logLevel).toBe('info');
    const log = capturedLogger(production.logLevel);
    const app = createApp({ ...ctx, config: { ...ctx.config, env: 'production' }, logger: log.logger });

    const newPassword = 'a fresh password for spring';
    const wrongPassword = 'a wrong guess at the password';
    const secrets: Record<string, string> = {
      password: PASSWORD,
      'new password': newPassword,
      'wrong password': wrongPassword,
    };
    const ownerEmail = uniqueEmail('keeper');
    const inviteeEmail = uniqueEmail('invitee');

    const registered = await request(app)
      .post('/api/auth/register')
      .send({ email: ownerEmail, password: PASSWORD, name: 'Keeper' });
    expect(registered.status).toBe(201);
    secrets['sign-up session'] = sessionToken(registered);

    expect(
      (await request(app).post('/api/auth/login').send({ email: ownerEmail, password: wrongPassword }))
        .status,
    ).toBe(401);
    const signedIn = await request(app)
      .post('/api/auth/login')
      .send({ email: ownerEmail, password: PASSWORD });
    expect(signedIn.status).toBe(200);
    const ownerCookie = `hilum_session=${(secrets['sign-in session'] = sessionToken(signedIn))}`;

    const bank = await request(app)
      .post('/api/banks')
      .set('Cookie', ownerCookie)
      .send({ name: 'Hill circle', lastFrost: '05-10' });
    expect(bank.status).toBe(201);
    const invited = await request(app)
      .post(`/api/banks/${bank.body.bank.id}/invitations`)
      .set('Cookie', ownerCookie)
      .send({ email: inviteeEmail, role: 'grower' });
    expect(invited.status).toBe(201);
    const invitation = await waitForMail((m) => m.to.includes(inviteeEmail) && /invit/i.test(m.text));
    const inviteLink = new URL(linkIn(invitation, `${ctx.config.appOrigin}/invitations/accept?token=`));
    const inviteToken = (secrets['invitation token'] = inviteLink.searchParams.get('token')!);

    // The invitee opens the mailed link (the app's page), signs up and accepts.
    await request(app).get(`${inviteLink.pathname}${inviteLink.search}`);
    const invitee = await request(app)
      .post('/api/auth/register')
      .send({ email: inviteeEmail, password: PASSWORD, name: 'Invitee' });
    expect(invitee.status).toBe(201);
    const inviteeCookie = `hilum_session=${(secrets['invitee session'] = sessionToken(invitee))}`;
    const accepted = await request(app)
      .post('/api/invitations/accept')
      .set('Cookie', inviteeCookie)
      .set('Referer', inviteLink.toString())
      .send({ token: inviteToken });
    expect(accepted.status).toBe(200);

    expect((await request(app).post('/api/auth/password-reset').send({ email: ownerEmail })).status).toBe(
      202,
    );
    const resetMail = await waitForMail((m) => m.to.includes(ownerEmail) && /reset/i.test(m.subject));
    const resetLink = new URL(linkIn(resetMail, `${ctx.config.appOrigin}/reset-password?token=`));
    const resetToken = (secrets['reset token'] = resetLink.searchParams.get('token')!);
    await request(app).get(`${resetLink.pathname}${resetLink.search}`);
    const confirmed = await request(app)
      .post('/api/auth/password-reset/confirm')
      .set('Referer', resetLink.toString())
      .send({ token: resetToken, password: newPassword });
    expect(confirmed.status).toBe(204);

    const again = await request(app)
      .post('/api/auth/login')
      .send({ email: ownerEmail, password: newPassword });
    expect(again.status).toBe(200);
    secrets['session after the reset'] = sessionToken(again);
    secrets['bearer credential'] = crypto.randomBytes(24).toString('base64url');
    const me = await request(app)
      .get('/api/me')
      .set('Cookie', `hilum_session=${secrets['session after the reset']}`)
      .set('Authorization', `Bearer ${secrets['bearer credential']}`);
    expect(me.status).toBe(200);

    // Any other link mailed to either person (an address confirmation, say) is a secret as well.
    for (const [i, token] of [
      ...(await linkTokens(ownerEmail)),
      ...(await linkTokens(inviteeEmail)),
    ].entries())
      secrets[`mailed link token ${i}`] ??= token;

    // Every request is logged when its answer is finished; the last one closes the log.
    const marker = crypto.randomBytes(6).toString('hex');
    expect((await request(app).get(`/api/health?last=${marker}`)).status).toBe(200);
    await expect.poll(() => log.text().includes(marker), { timeout: 10_000 }).toBe(true);

    const text = log.text();
    const found = Object.entries(secrets)
      .filter(([, secret]) => text.includes(secret) || text.includes(encodeURIComponent(secret)))
      .map(([name]) => name);
    expect(found).toEqual([]);
    // The log does name these requests, so a secret in them would have been written.
    expect(text).toContain('"url":"/api/auth/login"');
    expect(text).toContain('"url":"/reset-password?token=[redacted]"');
    expect(text).toContain('"url":"/invitations/accept?token=[redacted]"');
    expect(text).toContain('"set-cookie":"[redacted]"');
    expect(text).toContain('"cookie":"[redacted]"');
    expect(text).toContain('"authorization":"[redacted]"');
  });

  it.each(['warn', 'info'] as const)(
    'when a request with a token in its address fails unexpectedly at level %s, then the error line names it without the token',
    async (level) => {
      const log = capturedLogger(level);
      const secret = crypto.randomBytes(24).toString('base64url');
      const app = express();
      app.use(requestLogging(log.logger, true));
      app.get('/broken', () => {
        throw new Error('broken on purpose');
      });
      app.use(errorHandler(log.logger));
      const res = await request(app)
        .get(`/broken?token=${secret}&view=week`)
        .set('Cookie', `hilum_session=${secret}x`);
      expect(res.status).toBe(500);
      await expect.poll(() => log.text().includes('unhandled error'), { timeout: 10_000 }).toBe(true);
      const text = log.text();
      expect(text).not.toContain(secret);
      expect(text).toContain('/broken?token=[redacted]&view=week');
      expect(text).toContain('broken on purpose');
    },
  );
});
