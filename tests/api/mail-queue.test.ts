import net from 'node:net';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createMailQueue, retryDelay } from '#server/mail/mail-queue';
import { readOutbox } from '#server/mail/outbox';
import { createMailer } from '#server/mail/mailer';
import { signUp, uniqueEmail } from '../helpers/accounts';
import { cheapTestHasher, createTestContext, testConfig, type TestContext } from '../helpers/context';
import { linkIn, waitForMail } from '../helpers/outbox';

const POLL = { timeout: 30_000, interval: 100 };

/** How many mails to this address the SMTP fake holds (its outbox, read from disk). */
async function mailsTo(email: string, subject?: RegExp) {
  const all = await readOutbox(process.env.OUTBOX_DIR!, 2_000);
  return all.filter((m) => m.to.includes(email) && (!subject || subject.test(m.subject))).length;
}

/**
 * A switch in front of the SMTP fake: while off, its port is closed (connections are refused, as
 * with a mail server that is down); while on, it passes each connection through to the fake.
 */
async function smtpSwitch(target: { host: string; port: number }) {
  const sockets = new Set<net.Socket>();
  const make = () =>
    net.createServer((client) => {
      const upstream = net.connect(target.port, target.host);
      for (const s of [client, upstream]) {
        sockets.add(s);
        s.on('close', () => sockets.delete(s));
        s.on('error', () => s.destroy());
      }
      client.pipe(upstream).pipe(client);
    });
  let server = make();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const { port } = server.address() as net.AddressInfo;
  const off = async () => {
    for (const s of sockets) s.destroy();
    await new Promise((r) => server.close(r));
  };
  await off();
  return {
    port,
    async on() {
      server = make();
      await new Promise<void>((r) => server.listen(port, '127.0.0.1', r));
    },
    off,
  };
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2]! : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2;
};

describe('retry delays', () => {
  it('when sends keep failing, then each wait doubles from the first, up to the cap', () => {
    expect([1, 2, 3, 4, 5, 6, 7, 8].map((n) => retryDelay(n, 30_000, 3_600_000))).toEqual([
      30_000, 60_000, 120_000, 240_000, 480_000, 960_000, 1_920_000, 3_600_000,
    ]);
  });
});

describe('mail while the SMTP server is down', () => {
  let ctx: TestContext;
  let smtp: Awaited<ReturnType<typeof smtpSwitch>>;
  beforeAll(async () => {
    const mail = testConfig().mail;
    smtp = await smtpSwitch({ host: mail.host, port: mail.port });
    ctx = await createTestContext({
      config: { mail: { ...mail, port: smtp.port } },
      mailRetryDelayMs: 200,
    });
    ctx.mailQueue.start({ pollMs: 200 });
  });
  afterAll(async () => {
    await ctx.close();
    await smtp.off().catch(() => undefined);
  });

  it('when an invitation and a reset are asked for with SMTP down, then both answer 2xx and arrive once when it is back', async () => {
    const owner = await signUp(ctx.app, { name: 'Owner' });
    const bank = await owner.agent.post('/api/banks').send({ name: 'Outage circle' });
    const bankId = bank.body.bank.id as string;
    const invitee = uniqueEmail('outage-invitee');

    const invited = await owner.agent
      .post(`/api/banks/${bankId}/invitations`)
      .send({ email: invitee, role: 'grower' });
    expect(invited.status).toBe(201);
    expect(['waiting', 'retrying']).toContain(invited.body.invitation.mailState);
    const reset = await request(ctx.app).post('/api/auth/password-reset').send({ email: owner.email });
    expect(reset.status).toBe(202);

    // The worker tries, fails, and says so to the owner; nothing reaches the outbox meanwhile.
    await expect
      .poll(
        async () => (await owner.agent.get(`/api/banks/${bankId}/invitations`)).body.items[0].mailState,
        POLL,
      )
      .toBe('retrying');
    await expect
      .poll(
        async () =>
          (
            await ctx.db
              .selectFrom('mail_queue')
              .select('attempts')
              .where('kind', '=', 'password_reset')
              .executeTakeFirstOrThrow()
          ).attempts,
        POLL,
      )
      .toBeGreaterThanOrEqual(2);
    expect(await mailsTo(invitee)).toBe(0);
    expect(await mailsTo(owner.email, /reset/i)).toBe(0);

    await smtp.on();
    const invitation = await waitForMail((m) => m.to.includes(invitee), 30_000);
    const resetMail = await waitForMail(
      (m) => m.to.includes(owner.email) && /reset/i.test(m.subject),
      30_000,
    );
    await expect
      .poll(
        async () => (await owner.agent.get(`/api/banks/${bankId}/invitations`)).body.items[0].mailState,
        POLL,
      )
      .toBe('sent');
    // Nothing is left to send, and a further pass sends nothing again.
    await expect
      .poll(
        async () =>
          (await ctx.db.selectFrom('mail_queue').select('status').execute()).filter(
            (r) => r.status !== 'sent',
          ).length,
        POLL,
      )
      .toBe(0);
    await ctx.mailQueue.drain();
    expect(await mailsTo(invitee)).toBe(1);
    expect(await mailsTo(owner.email, /reset/i)).toBe(1);
    // A sent mail no longer holds its link in the database.
    const bodies = await ctx.db.selectFrom('mail_queue').select('body').execute();
    expect(bodies.every((r) => r.body === null)).toBe(true);
    // The links in them work.
    const token = new URL(
      linkIn(invitation, `${ctx.config.appOrigin}/invitations/accept?token=`),
    ).searchParams.get('token')!;
    const newcomer = await signUp(ctx.app, { email: invitee });
    expect((await newcomer.agent.post('/api/invitations/accept').send({ token })).status).toBe(200);
    const resetToken = new URL(
      linkIn(resetMail, `${ctx.config.appOrigin}/reset-password?token=`),
    ).searchParams.get('token')!;
    expect(
      (
        await request(ctx.app)
          .post('/api/auth/password-reset/confirm')
          .send({ token: resetToken, password: 'after the outage' })
      ).status,
    ).toBe(204);
  });
});

describe('the mail queue shared by two servers', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(() => ctx.close());

  it('when two workers drain the same queue at once, then every mail arrives exactly once', async () => {
    const tag = uniqueEmail('pair').split('@')[0]!;
    const addresses = Array.from({ length: 12 }, (_, i) => `${tag}-${i}@example.org`);
    await ctx.db.transaction().execute(async (trx) => {
      for (const to of addresses) {
        await ctx.mailQueue.enqueue(trx, {
          kind: 'invitation',
          to,
          subject: `Pair test ${to}`,
          text: 'Hello.',
        });
      }
    });
    const mailers = [createMailer(ctx.config.mail), createMailer(ctx.config.mail)];
    const servers = mailers.map((mailer) => createMailQueue({ db: ctx.db, mailer, clock: ctx.clock }));
    await Promise.all(servers.map((s) => s.drain()));
    for (const m of mailers) m.close();
    for (const to of addresses) expect(await mailsTo(to)).toBe(1);
  });

  it('when a worker died while sending, then its claim runs out and the mail is sent by another', async () => {
    const to = uniqueEmail('orphan');
    const id = await ctx.mailQueue.enqueue(ctx.db, {
      kind: 'invitation',
      to,
      subject: 'Orphaned',
      text: 'Hi.',
    });
    // As a crashed process leaves it: claimed, never marked.
    await ctx.db
      .updateTable('mail_queue')
      .set({ status: 'sending', claimed_at: new Date(), attempts: 1 })
      .where('id', '=', id)
      .execute();
    await ctx.mailQueue.drain();
    expect(await mailsTo(to)).toBe(0);
    await ctx.db
      .updateTable('mail_queue')
      .set({ claimed_at: new Date(Date.now() - 3 * 60_000) })
      .where('id', '=', id)
      .execute();
    await ctx.mailQueue.drain();
    await waitForMail((m) => m.to.includes(to));
    expect(await mailsTo(to)).toBe(1);
  });

  it('when a queued mail’s link has expired before it could be sent, then it is dropped', async () => {
    const to = uniqueEmail('late');
    const id = await ctx.mailQueue.enqueue(ctx.db, {
      kind: 'invitation',
      to,
      subject: 'Too late',
      text: 'Hi.',
      expiresAt: new Date(ctx.clock.now().getTime() - 1),
    });
    await ctx.mailQueue.drain();
    const row = await ctx.db
      .selectFrom('mail_queue')
      .select('status')
      .where('id', '=', id)
      .executeTakeFirstOrThrow();
    expect(row.status).toBe('expired');
    expect(await mailsTo(to)).toBe(0);
  });
});

describe('password reset requests', () => {
  let ctx: TestContext;
  beforeAll(async () => {
    ctx = await createTestContext();
  });
  afterAll(() => ctx.close());

  it('when known and unknown addresses ask, then both do the same work and take the same time', async () => {
    const tries = 6;
    const known: string[] = [];
    for (let i = 0; i < tries; i++) known.push((await signUp(ctx.app, { name: 'Known' })).email);
    await ctx.mailQueue.drain();
    // Keep the worker out of the timed requests: it is stopped, the rows wait.
    await ctx.mailQueue.stop();
    const before = await ctx.db.selectFrom('password_resets').select('id').execute();
    const times = { known: [] as number[], unknown: [] as number[] };
    for (let i = 0; i < tries; i++) {
      for (const [which, email] of [
        ['known', known[i]!],
        ['unknown', uniqueEmail('nobody')],
      ] as const) {
        const started = performance.now();
        const res = await request(ctx.app).post('/api/auth/password-reset').send({ email });
        times[which].push(performance.now() - started);
        expect(res.status).toBe(202);
      }
    }
    // Structurally the same: one queued row each, and no reset link written in the request.
    const queued = await ctx.db
      .selectFrom('mail_queue')
      .select(['to_address', 'subject', 'body', 'status'])
      .where('kind', '=', 'password_reset')
      .execute();
    expect(queued).toHaveLength(2 * tries);
    expect(queued.every((r) => r.subject === null && r.body === null && r.status === 'waiting')).toBe(true);
    expect(await ctx.db.selectFrom('password_resets').select('id').execute()).toHaveLength(before.length);
    // And in time: the medians differ by little next to themselves (a busy machine adds noise to both).
    const [k, u] = [median(times.known), median(times.unknown)];
    expect(Math.abs(k - u)).toBeLessThan(Math.max(k, u) * 0.5 + 10);

    // Once the worker runs, the known addresses get a link and the unknown ones nothing.
    ctx.mailQueue.start({ pollMs: 200 });
    for (const email of known) await waitForMail((m) => m.to.includes(email) && /reset/i.test(m.subject));
    await expect
      .poll(
        async () =>
          (
            await ctx.db
              .selectFrom('mail_queue')
              .select('status')
              .where('kind', '=', 'password_reset')
              .where('status', '=', 'skipped')
              .execute()
          ).length,
        POLL,
      )
      .toBe(tries);
    expect(await ctx.db.selectFrom('password_resets').select('id').execute()).toHaveLength(
      before.length + tries,
    );
  });
});

describe('password reset links', () => {
  let ctx: TestContext;
  let hashed = 0;
  beforeAll(async () => {
    // The tests' own hasher, counting the passwords it hashes.
    ctx = await createTestContext({
      hasher: {
        hash: (password) => {
          hashed += 1;
          return cheapTestHasher.hash(password);
        },
        verify: cheapTestHasher.verify,
      },
    });
  });
  afterAll(() => ctx.close());

  /** Asks for a reset and returns the token of the new mail (one not in `seen`). */
  async function resetLink(email: string, seen: Set<string>) {
    await request(ctx.app).post('/api/auth/password-reset').send({ email });
    const mail = await waitForMail(
      (m) => m.to.includes(email) && /reset/i.test(m.subject) && !seen.has(m.id),
    );
    seen.add(mail.id);
    return new URL(linkIn(mail, `${ctx.config.appOrigin}/reset-password?token=`)).searchParams.get('token')!;
  }

  it('when the token is bogus, then it is 400 and no password is hashed', async () => {
    const before = hashed;
    const res = await request(ctx.app)
      .post('/api/auth/password-reset/confirm')
      .send({ token: 'x'.repeat(43), password: 'a perfectly fine password' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_token');
    expect(hashed).toBe(before);
  });

  it('when a newer link is used, then the older unused link stops working', async () => {
    const { email } = await signUp(ctx.app);
    const seen = new Set<string>();
    const older = await resetLink(email, seen);
    const newer = await resetLink(email, seen);
    expect(older).not.toBe(newer);
    const confirm = (token: string, password: string) =>
      request(ctx.app).post('/api/auth/password-reset/confirm').send({ token, password });
    expect((await confirm(newer, 'the newer password')).status).toBe(204);
    const before = hashed;
    const stale = await confirm(older, 'the older password');
    expect(stale.status).toBe(400);
    expect(hashed).toBe(before);
    expect(
      (await request(ctx.app).post('/api/auth/login').send({ email, password: 'the newer password' })).status,
    ).toBe(200);
  });

  it('when a link is used, then the account’s address counts as proved', async () => {
    const { email, agent } = await signUp(ctx.app);
    expect((await agent.get('/api/me')).body.user.emailVerified).toBe(false);
    const token = await resetLink(email, new Set());
    await request(ctx.app)
      .post('/api/auth/password-reset/confirm')
      .send({ token, password: 'proved by reset' });
    const again = await request
      .agent(ctx.app)
      .post('/api/auth/login')
      .send({ email, password: 'proved by reset' });
    expect(again.body.user.emailVerified).toBe(true);
  });
});
