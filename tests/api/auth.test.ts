import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '#server/app';
import { createTestContext, type TestContext } from '../helpers/context';
import { PASSWORD, signIn, signUp, uniqueEmail } from '../helpers/accounts';
import { linkIn, waitForMail } from '../helpers/outbox';

describe('accounts', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(() => ctx.close());

  it('when a person registers, then they are signed in, and after sign-out /api/me is 401', async () => {
    const agent = request.agent(ctx.app);
    const email = uniqueEmail();
    const reg = await agent
      .post('/api/auth/register')
      .send({ email: `  ${email.toUpperCase()} `, password: PASSWORD, name: ' Ada ' });
    expect(reg.status).toBe(201);
    expect(reg.body.user).toEqual({ id: expect.any(String), email, name: 'Ada', emailVerified: false });
    expect(reg.body.user.passwordHash ?? reg.body.user.password_hash).toBeUndefined();
    const cookie = String(reg.headers['set-cookie']);
    expect(cookie).toMatch(/^hilum_session=/);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Lax/);
    expect(cookie).toMatch(/Path=\//);

    const me = await agent.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body).toEqual({ user: reg.body.user, memberships: [] });

    expect((await agent.post('/api/auth/logout')).status).toBe(204);
    expect((await agent.get('/api/me')).status).toBe(401);
  });

  it('when the password is stored, then it is an argon2id hash, never the password', async () => {
    const { user } = await signUp(ctx.app);
    const row = await ctx.db
      .selectFrom('users')
      .select('password_hash')
      .where('id', '=', user.id)
      .executeTakeFirstOrThrow();
    expect(row.password_hash).toMatch(/^\$argon2id\$/);
    expect(row.password_hash).not.toContain(PASSWORD);
  });

  // The other tests run the app with a cheap hasher (tests/helpers/context.ts); this one runs it as
  // production does, with none given.
  it('when the production app stores a password, then it is argon2id at full strength, and signing in checks it', async () => {
    const app = createApp({ ...ctx, hasher: undefined });
    const { user, email } = await signUp(app);
    const row = await ctx.db
      .selectFrom('users')
      .select('password_hash')
      .where('id', '=', user.id)
      .executeTakeFirstOrThrow();
    // PHC string of argon2id, version 0x13 = 19 (RFC 9106, section 3.1), with the argon2 package's
    // defaults: 65536 KiB, 3 passes, 4 lanes (documented in its argon2.d.cts). OWASP's Password Storage
    // Cheat Sheet asks for at least 19 MiB, 2 passes, 1 lane (from memory; the package is the source).
    expect(row.password_hash).toMatch(/^\$argon2id\$v=19\$m=65536,t=3,p=4\$/);
    expect(row.password_hash).not.toContain(PASSWORD);
    expect((await request(app).post('/api/auth/login').send({ email, password: PASSWORD })).status).toBe(200);
    expect(
      (await request(app).post('/api/auth/login').send({ email, password: 'not the password' })).status,
    ).toBe(401);
  });

  it('when the e-mail is taken in any letter case, then registering again is 409', async () => {
    const { email } = await signUp(ctx.app);
    const res = await request(ctx.app)
      .post('/api/auth/register')
      .send({ email: email.toUpperCase(), password: PASSWORD, name: 'Twin' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('email_taken');
  });

  it('when the password is shorter than 10 characters, then it is 400 naming the field', async () => {
    const res = await request(ctx.app)
      .post('/api/auth/register')
      .send({ email: uniqueEmail(), password: 'short', name: 'X' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.password).toMatch(/10 characters/);
  });

  it('when the password is wrong or the e-mail unknown, then both are 401 with the same message', async () => {
    const { email } = await signUp(ctx.app);
    const wrong = await request(ctx.app)
      .post('/api/auth/login')
      .send({ email, password: 'not the password' });
    const unknown = await request(ctx.app)
      .post('/api/auth/login')
      .send({ email: uniqueEmail('nobody'), password: PASSWORD });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
  });

  it('when the session row is deleted by hand, then the same cookie is refused once its notice is in', async () => {
    const { agent, user } = await signUp(ctx.app);
    expect((await agent.get('/api/me')).status).toBe(200);
    expect((await agent.get('/api/me')).status).toBe(200);
    await ctx.db.deleteFrom('sessions').where('user_id', '=', user.id).execute();
    // A statement outside the app (or another server) is heard through PostgreSQL's change
    // notice, which lands milliseconds after the commit; sync() waits for exactly that.
    await ctx.changeFeed.sync();
    expect((await agent.get('/api/me')).status).toBe(401);
  });

  it('when a copied token is used after sign-out, then it is refused', async () => {
    const { agent, email } = await signUp(ctx.app);
    const login = await request(ctx.app).post('/api/auth/login').send({ email, password: PASSWORD });
    const copied = String(login.headers['set-cookie']).split(';')[0]!;
    expect((await request(ctx.app).get('/api/me').set('Cookie', copied)).status).toBe(200);
    await request(ctx.app).post('/api/auth/logout').set('Cookie', copied);
    expect((await request(ctx.app).get('/api/me').set('Cookie', copied)).status).toBe(401);
    expect((await agent.get('/api/me')).status).toBe(200);
  });

  it('when a forged token is sent, then the caller is not signed in', async () => {
    const res = await request(ctx.app)
      .get('/api/me')
      .set('Cookie', 'hilum_session=eyJhbGciOiJIUzI1NiJ9.e30.x');
    expect(res.status).toBe(401);
  });

  it('when someone signs out everywhere, then every session of theirs ends', async () => {
    const { agent, email } = await signUp(ctx.app);
    const other = await signIn(ctx.app, email);
    expect((await other.get('/api/me')).status).toBe(200);
    expect((await agent.post('/api/auth/logout-all')).status).toBe(204);
    expect((await other.get('/api/me')).status).toBe(401);
    expect((await agent.get('/api/me')).status).toBe(401);
  });

  it('when sign-in fails repeatedly for one e-mail, then it answers 429 in the error shape', async () => {
    const { email } = await signUp(ctx.app);
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) {
      statuses.push(
        (await request(ctx.app).post('/api/auth/login').send({ email, password: 'wrong password' })).status,
      );
    }
    expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    const res = await request(ctx.app).post('/api/auth/login').send({ email, password: PASSWORD });
    expect(res.status).toBe(429);
    expect(res.body.error.code).toBe('rate_limited');
  });
});

describe('password reset by e-mail', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(() => ctx.close());

  it('when an unknown e-mail asks for a reset, then it is still 202 and no mail is sent', async () => {
    const email = uniqueEmail('ghost');
    const res = await request(ctx.app).post('/api/auth/password-reset').send({ email });
    expect(res.status).toBe(202);
    // The queue's worker finds no account and drops the request without a mail.
    await expect
      .poll(
        async () =>
          (
            await ctx.db
              .selectFrom('mail_queue')
              .select('status')
              .where('to_address', '=', email)
              .executeTakeFirst()
          )?.status,
        { timeout: 20_000 },
      )
      .toBe('skipped');
    await expect(waitForMail((m) => m.to.includes(email), 800)).rejects.toThrow(/no matching mail/);
  });

  it('when the mailed link is used, then the password changes, old sessions end, and the link works once', async () => {
    const { agent, email } = await signUp(ctx.app);
    expect(
      (await request(ctx.app).post('/api/auth/password-reset').send({ email: email.toUpperCase() })).status,
    ).toBe(202);
    const mail = await waitForMail((m) => m.to.includes(email) && /reset/i.test(m.subject));
    const link = new URL(linkIn(mail, `${ctx.config.appOrigin}/reset-password?token=`));
    const token = link.searchParams.get('token')!;
    // Only a hash of the token is stored.
    const stored = await ctx.db.selectFrom('password_resets').select('token_hash').execute();
    expect(stored.map((r) => r.token_hash)).not.toContain(token);

    const newPassword = 'a brand new password';
    expect(
      (await request(ctx.app).post('/api/auth/password-reset/confirm').send({ token, password: newPassword }))
        .status,
    ).toBe(204);
    expect((await agent.get('/api/me')).status).toBe(401);
    expect((await request(ctx.app).post('/api/auth/login').send({ email, password: PASSWORD })).status).toBe(
      401,
    );
    expect(
      (await request(ctx.app).post('/api/auth/login').send({ email, password: newPassword })).status,
    ).toBe(200);

    const reused = await request(ctx.app)
      .post('/api/auth/password-reset/confirm')
      .send({ token, password: 'yet another password' });
    expect(reused.status).toBe(400);
    expect(reused.body.error.code).toBe('invalid_token');
  });

  it('when the link is older than an hour, then it is 400', async () => {
    const { email } = await signUp(ctx.app);
    await request(ctx.app).post('/api/auth/password-reset').send({ email });
    const mail = await waitForMail((m) => m.to.includes(email) && /reset/i.test(m.subject));
    const token = new URL(linkIn(mail, ctx.config.appOrigin)).searchParams.get('token')!;
    ctx.clock.set(new Date(ctx.clock.now().getTime() + 61 * 60_000));
    const res = await request(ctx.app)
      .post('/api/auth/password-reset/confirm')
      .send({ token, password: 'a brand new password' });
    expect(res.status).toBe(400);
  });

  it('when resets are asked for too often for one address, then it answers 429', async () => {
    const email = uniqueEmail('many');
    const statuses = [];
    for (let i = 0; i < 4; i++)
      statuses.push((await request(ctx.app).post('/api/auth/password-reset').send({ email })).status);
    expect(statuses).toEqual([202, 202, 202, 429]);
  });
});
