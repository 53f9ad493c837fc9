import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, addDemoPeople } from '#server/demo/demo-people';
import type { CapturedMail } from '#server/mail/outbox';
import { signIn, signUp, uniqueEmail } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { linkIn, waitForMail } from '../helpers/outbox';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(() => ctx.close());

const tokenOf = (mail: CapturedMail, path: string) =>
  new URL(linkIn(mail, `${ctx.config.appOrigin}${path}?token=`)).searchParams.get('token')!;

async function bankWithOwner() {
  const owner = await signUp(ctx.app, { name: 'Owner' });
  const created = await owner.agent.post('/api/banks').send({ name: 'Ridge circle' });
  return { owner, bankId: created.body.bank.id as string };
}

/** Invites `email` and returns the token of the mail that arrives (one not in `seen`). */
async function invite(
  owner: Awaited<ReturnType<typeof signUp>>,
  bankId: string,
  email: string,
  role: 'owner' | 'grower' | 'viewer',
) {
  const res = await owner.agent.post(`/api/banks/${bankId}/invitations`).send({ email, role });
  expect(res.status).toBe(201);
  const mail = await waitForMail((m) => m.to.includes(email) && /invites you/.test(m.subject));
  return { invitation: res.body.invitation, token: tokenOf(mail, '/invitations/accept'), mail };
}

describe('who may accept an invitation', () => {
  it('when another account uses the link, then it is 403 and the invitation stays open for its address', async () => {
    const { owner, bankId } = await bankWithOwner();
    const email = uniqueEmail('invited');
    const { token } = await invite(owner, bankId, email, 'grower');
    const stranger = await signUp(ctx.app, { name: 'Stranger' });
    const refused = await stranger.agent.post('/api/invitations/accept').send({ token });
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('wrong_account');
    expect(refused.body.error.message).toContain(email);
    expect((await stranger.agent.get('/api/me')).body.memberships).toEqual([]);

    const invited = await signUp(ctx.app, { email });
    const accepted = await invited.agent.post('/api/invitations/accept').send({ token });
    expect(accepted.status).toBe(200);
    expect(accepted.body.role).toBe('grower');
  });

  it('when the account’s address differs only in letter case, then it may accept', async () => {
    const { owner, bankId } = await bankWithOwner();
    const email = uniqueEmail('casey');
    const { token } = await invite(owner, bankId, email, 'viewer');
    const invited = await signUp(ctx.app, { email });
    // An address stored with capitals (as an older account may have it).
    await ctx.db
      .updateTable('users')
      .set({ email: email.toUpperCase() })
      .where('id', '=', invited.user.id)
      .execute();
    expect((await invited.agent.post('/api/invitations/accept').send({ token })).status).toBe(200);
  });

  it('when an invitation as owner meets an unconfirmed account, then it is 403 until the address is confirmed', async () => {
    const { owner, bankId } = await bankWithOwner();
    const email = uniqueEmail('co-owner');
    const { token } = await invite(owner, bankId, email, 'owner');
    const invited = await signUp(ctx.app, { email });
    const refused = await invited.agent.post('/api/invitations/accept').send({ token });
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('email_unverified');

    const mail = await waitForMail((m) => m.to.includes(email) && /confirm your e-mail/i.test(m.subject));
    const verified = await request(ctx.app)
      .post('/api/auth/verify-email')
      .send({ token: tokenOf(mail, '/verify-email') });
    expect(verified.status).toBe(200);
    expect(verified.body.user).toMatchObject({ email, emailVerified: true });
    const accepted = await invited.agent.post('/api/invitations/accept').send({ token });
    expect(accepted.status).toBe(200);
    expect(accepted.body.role).toBe('owner');
  });
});

describe('confirming an e-mail address', () => {
  it('when a person signs up, then a link is mailed, works once, and /api/me shows the address confirmed', async () => {
    const { agent, email } = await signUp(ctx.app);
    expect((await agent.get('/api/me')).body.user.emailVerified).toBe(false);
    const mail = await waitForMail((m) => m.to.includes(email) && /confirm your e-mail/i.test(m.subject));
    const token = tokenOf(mail, '/verify-email');
    expect((await request(ctx.app).post('/api/auth/verify-email').send({ token })).status).toBe(200);
    expect((await agent.get('/api/me')).body.user.emailVerified).toBe(true);
    const again = await request(ctx.app).post('/api/auth/verify-email').send({ token });
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('invalid_token');
    const resend = await agent.post('/api/auth/verify-email/resend');
    expect(resend.status).toBe(409);
    expect(resend.body.error.code).toBe('already_verified');
  });

  it('when the link is asked for again, then a new one arrives and works', async () => {
    const { agent, email } = await signUp(ctx.app);
    const first = await waitForMail((m) => m.to.includes(email) && /confirm/i.test(m.subject));
    expect((await agent.post('/api/auth/verify-email/resend')).status).toBe(202);
    const second = await waitForMail(
      (m) => m.to.includes(email) && /confirm/i.test(m.subject) && m.id !== first.id,
    );
    const res = await request(ctx.app)
      .post('/api/auth/verify-email')
      .send({ token: tokenOf(second, '/verify-email') });
    expect(res.status).toBe(200);
    expect((await agent.get('/api/me')).body.user.emailVerified).toBe(true);
  });

  it('when the demo people sign in, then their addresses count as confirmed', async () => {
    await addDemoPeople(ctx.db, ctx.hasher);
    for (const account of DEMO_ACCOUNTS) {
      const agent = await signIn(ctx.app, account.email, DEMO_PASSWORD);
      expect((await agent.get('/api/me')).body.user).toMatchObject({
        email: account.email,
        emailVerified: true,
      });
    }
  });

  it('when the token is missing or not signed in to resend, then it is 400 or 401 in the error shape', async () => {
    const missing = await request(ctx.app).post('/api/auth/verify-email').send({});
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields).toHaveProperty('token');
    expect((await request(ctx.app).post('/api/auth/verify-email/resend')).status).toBe(401);
  });
});

describe('sending an invitation again', () => {
  it('when an owner resends, then a new link arrives, the old one stops working, and the state is shown', async () => {
    const { owner, bankId } = await bankWithOwner();
    const email = uniqueEmail('again');
    const first = await invite(owner, bankId, email, 'grower');
    await expect
      .poll(async () => (await owner.agent.get(`/api/banks/${bankId}/invitations`)).body.items[0].mailState, {
        timeout: 20_000,
      })
      .toBe('sent');

    const resent = await owner.agent.post(`/api/banks/${bankId}/invitations/${first.invitation.id}/resend`);
    expect(resent.status).toBe(200);
    expect(resent.body.invitation).toMatchObject({ id: first.invitation.id, email, mailState: 'waiting' });
    const second = await waitForMail((m) => m.to.includes(email) && m.id !== first.mail.id);
    const newToken = tokenOf(second, '/invitations/accept');
    expect(newToken).not.toBe(first.token);

    const invited = await signUp(ctx.app, { email });
    expect((await invited.agent.post('/api/invitations/accept').send({ token: first.token })).status).toBe(
      400,
    );
    expect((await invited.agent.post('/api/invitations/accept').send({ token: newToken })).status).toBe(200);
  });

  it('when the invitation is closed, the id malformed, or the bank another’s, then it is 404 (a malformed id is no record)', async () => {
    const { owner, bankId } = await bankWithOwner();
    const { invitation } = await invite(owner, bankId, uniqueEmail('closed'), 'viewer');
    await owner.agent.delete(`/api/banks/${bankId}/invitations/${invitation.id}`);
    const gone = await owner.agent.post(`/api/banks/${bankId}/invitations/${invitation.id}/resend`);
    expect(gone.status).toBe(404);
    const bad = await owner.agent.post(`/api/banks/${bankId}/invitations/not-an-id/resend`);
    expect(bad.status).toBe(404);
    expect(bad.body.error.code).toBe('not_found');

    const other = await bankWithOwner();
    const open = await invite(other.owner, other.bankId, uniqueEmail('theirs'), 'viewer');
    const notMine = await owner.agent.post(
      `/api/banks/${other.bankId}/invitations/${open.invitation.id}/resend`,
    );
    expect(notMine.status).toBe(404);
  });
});
