import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bankWithRoles, signUp, uniqueEmail } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { linkIn, waitForMail } from '../helpers/outbox';

describe('banks and members', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(() => ctx.close());

  it('when someone creates a bank, then they are its owner and it shows in /api/me', async () => {
    const { agent } = await signUp(ctx.app);
    const res = await agent
      .post('/api/banks')
      .send({ name: 'Hillside swap', lastFrost: '05-24', firstFrost: '09-20' });
    expect(res.status).toBe(201);
    expect(res.body.bank).toMatchObject({ name: 'Hillside swap', lastFrost: '05-24', firstFrost: '09-20' });
    const me = await agent.get('/api/me');
    expect(me.body.memberships).toEqual([
      { bankId: res.body.bank.id, bankName: 'Hillside swap', role: 'owner' },
    ]);
    const bank = await agent.get(`/api/banks/${res.body.bank.id}`);
    expect(bank.body.role).toBe('owner');
  });

  const bankNames = async (agent: ReturnType<typeof request.agent>) =>
    (await agent.get('/api/me')).body.memberships.map((m: { bankName: string }) => m.bankName).sort();

  it('when a bank is created with its creator’s time zone, then it keeps it', async () => {
    const { agent } = await signUp(ctx.app);
    // IANA time zone database names (common practice): Pacific/Auckland is a real zone.
    const zoned = await agent.post('/api/banks').send({ name: 'Zoned', timeZone: 'Pacific/Auckland' });
    expect(zoned.status).toBe(201);
    expect(zoned.body.bank.timeZone).toBe('Pacific/Auckland');
    expect(await bankNames(agent)).toEqual(['Zoned']);
  });

  it('when a bank is created without a time zone, then it is UTC', async () => {
    const { agent } = await signUp(ctx.app);
    expect((await agent.post('/api/banks').send({ name: 'Plain' })).body.bank.timeZone).toBe('UTC');
    expect(await bankNames(agent)).toEqual(['Plain']);
  });

  it('when a bank is created with an unknown time zone, then it is 400 and no bank', async () => {
    const { agent } = await signUp(ctx.app);
    const bad = await agent.post('/api/banks').send({ name: 'Nowhere', timeZone: 'Mars/Olympus' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.timeZone).toMatch(/Not a known time zone/);
    expect(await bankNames(agent)).toEqual([]);
  });

  it('when a frost date is not a real month-day, then it is 400 naming the field', async () => {
    const { agent } = await signUp(ctx.app);
    const res = await agent.post('/api/banks').send({ name: 'X', lastFrost: '02-30' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.lastFrost).toBeTruthy();
  });

  it('when the owner updates settings, then they are kept', async () => {
    const { agent } = await signUp(ctx.app);
    const { body } = await agent.post('/api/banks').send({ name: 'Y' });
    const patched = await agent
      .patch(`/api/banks/${body.bank.id}`)
      .send({ frostMarginDays: 14, timeZone: 'America/Winnipeg' });
    expect(patched.status).toBe(200);
    expect(patched.body.bank).toMatchObject({ frostMarginDays: 14, timeZone: 'America/Winnipeg' });
  });

  it('when the owner sets a bad time zone, then it is 400', async () => {
    const { agent } = await signUp(ctx.app);
    const { body } = await agent.post('/api/banks').send({ name: 'Y' });
    expect((await agent.patch(`/api/banks/${body.bank.id}`).send({ timeZone: 'Mars/Olympus' })).status).toBe(
      400,
    );
  });

  describe('when the last owner', () => {
    const stillOwner = async ({ bankId, owner }: Awaited<ReturnType<typeof bankWithRoles>>) => {
      const members = await owner.agent.get(`/api/banks/${bankId}/members`);
      expect(members.body.items.find((m: { userId: string }) => m.userId === owner.user.id).role).toBe(
        'owner',
      );
    };

    it('is demoted, then it is 409 and nothing changes', async () => {
      const bank = await bankWithRoles(ctx.app, ctx.db);
      const demote = await bank.owner.agent
        .patch(`/api/banks/${bank.bankId}/members/${bank.owner.user.id}`)
        .send({ role: 'grower' });
      expect(demote.status).toBe(409);
      expect(demote.body.error.code).toBe('last_owner');
      await stillOwner(bank);
    });

    it('is removed, then it is 409 and nothing changes', async () => {
      const bank = await bankWithRoles(ctx.app, ctx.db);
      expect(
        (await bank.owner.agent.delete(`/api/banks/${bank.bankId}/members/${bank.owner.user.id}`)).status,
      ).toBe(409);
      await stillOwner(bank);
    });

    it('leaves, then it is 409 and nothing changes', async () => {
      const bank = await bankWithRoles(ctx.app, ctx.db);
      expect((await bank.owner.agent.post(`/api/banks/${bank.bankId}/leave`)).status).toBe(409);
      await stillOwner(bank);
    });
  });

  it('when a member has not confirmed their e-mail, then they cannot be made an owner', async () => {
    const { bankId, owner, grower } = await bankWithRoles(ctx.app, ctx.db);
    const res = await owner.agent
      .patch(`/api/banks/${bankId}/members/${grower.user.id}`)
      .send({ role: 'owner' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('email_unverified');
    expect((await grower.agent.get(`/api/banks/${bankId}`)).body.role).toBe('grower');
  });

  it('when a second owner exists, then the first may step down', async () => {
    const { bankId, owner, grower } = await bankWithRoles(ctx.app, ctx.db);
    await ctx.db
      .updateTable('users')
      .set({ email_verified_at: new Date() })
      .where('id', '=', grower.user.id)
      .execute();
    expect(
      (await owner.agent.patch(`/api/banks/${bankId}/members/${grower.user.id}`).send({ role: 'owner' }))
        .status,
    ).toBe(200);
    expect(
      (await owner.agent.patch(`/api/banks/${bankId}/members/${owner.user.id}`).send({ role: 'viewer' }))
        .status,
    ).toBe(200);
    expect((await owner.agent.get(`/api/banks/${bankId}`)).body.role).toBe('viewer');
  });

  it('when a member leaves, then the bank is 404 to them', async () => {
    const { bankId, viewer } = await bankWithRoles(ctx.app, ctx.db);
    expect((await viewer.agent.post(`/api/banks/${bankId}/leave`)).status).toBe(204);
    expect((await viewer.agent.get(`/api/banks/${bankId}`)).status).toBe(404);
  });

  it('when a member is removed, then the bank is 404 to them', async () => {
    const { bankId, owner, grower } = await bankWithRoles(ctx.app, ctx.db);
    expect((await owner.agent.delete(`/api/banks/${bankId}/members/${grower.user.id}`)).status).toBe(204);
    expect((await grower.agent.get(`/api/banks/${bankId}/members`)).status).toBe(404);
  });

  it('when a bank id is malformed or unknown, then it is 404 like a bank one is not in', async () => {
    const { agent } = await signUp(ctx.app);
    const malformed = await agent.get('/api/banks/not-a-uuid');
    const unknown = await agent.get('/api/banks/00000000-0000-4000-8000-000000000000');
    expect(malformed.status).toBe(404);
    expect(unknown.status).toBe(404);
    expect(malformed.body).toEqual(unknown.body);
  });
});

describe('invitations by e-mail', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(() => ctx.close());

  async function invite(role: 'grower' | 'viewer' = 'grower') {
    const { bankId, owner } = await bankWithRoles(ctx.app, ctx.db);
    const email = uniqueEmail('invitee');
    const res = await owner.agent.post(`/api/banks/${bankId}/invitations`).send({ email, role });
    expect(res.status).toBe(201);
    const mail = await waitForMail((m) => m.to.includes(email));
    const token = new URL(linkIn(mail, `${ctx.config.appOrigin}/invitations/accept?token=`)).searchParams.get(
      'token',
    )!;
    return { bankId, owner, email, token, mail };
  }

  it('when an owner invites, then the invitee registers, accepts and sees the bank with that role', async () => {
    const { bankId, owner, email, token, mail } = await invite('grower');
    expect(mail.subject).toMatch(/Test circle/);
    const listed = await owner.agent.get(`/api/banks/${bankId}/invitations`);
    expect(listed.body.items).toEqual([
      expect.objectContaining({ email, role: 'grower', invitedBy: 'Owner' }),
    ]);

    const invitee = await signUp(ctx.app, { email });
    const accepted = await invitee.agent.post('/api/invitations/accept').send({ token });
    expect(accepted.status).toBe(200);
    expect(accepted.body).toMatchObject({ bankId, role: 'grower' });
    const me = await invitee.agent.get('/api/me');
    expect(me.body.memberships).toEqual([{ bankId, bankName: 'Test circle', role: 'grower' }]);
    expect((await invitee.agent.get(`/api/banks/${bankId}`)).body.role).toBe('grower');
    expect((await owner.agent.get(`/api/banks/${bankId}/invitations`)).body.items).toEqual([]);

    const again = await invitee.agent.post('/api/invitations/accept').send({ token });
    expect(again.status).toBe(400);
  });

  it('when an invitation is older than 7 days, then accepting it is 400', async () => {
    const { email, token } = await invite();
    const invitee = await signUp(ctx.app, { email });
    ctx.clock.advanceDays(8);
    try {
      expect((await invitee.agent.post('/api/invitations/accept').send({ token })).status).toBe(400);
    } finally {
      ctx.clock.advanceDays(-8);
    }
  });

  it('when accepting without signing in, then it is 401 and the invitation stays open', async () => {
    const { bankId, owner, token } = await invite();
    expect((await request(ctx.app).post('/api/invitations/accept').send({ token })).status).toBe(401);
    expect((await owner.agent.get(`/api/banks/${bankId}/invitations`)).body.items).toHaveLength(1);
  });

  it('when an existing member is invited, then it is 409', async () => {
    const { bankId, owner, grower } = await bankWithRoles(ctx.app, ctx.db);
    const res = await owner.agent
      .post(`/api/banks/${bankId}/invitations`)
      .send({ email: grower.email.toUpperCase(), role: 'viewer' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('already_member');
  });

  it('when an invitation is revoked, then its link no longer works', async () => {
    const { bankId, owner, email, token } = await invite();
    const { body } = await owner.agent.get(`/api/banks/${bankId}/invitations`);
    expect((await owner.agent.delete(`/api/banks/${bankId}/invitations/${body.items[0].id}`)).status).toBe(
      204,
    );
    const invitee = await signUp(ctx.app, { email });
    expect((await invitee.agent.post('/api/invitations/accept').send({ token })).status).toBe(400);
  });
});
