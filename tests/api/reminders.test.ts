import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { sql } from 'kysely';
import { SMTPServer } from 'smtp-server';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { REMINDER_QUEUE } from '#server/jobs/reminders';
import { createMailer } from '#server/mail/mailer';
import { readOutbox } from '#server/mail/outbox';
import { createReminders } from '#server/modules/reminders/reminders.service';
import { createViabilityService } from '#server/modules/viability/viability.service';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';
import { waitForMail } from '../helpers/outbox';

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });

describe('e-mail reminders on the durable queue', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let testCode: string;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-03-01T09:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db);
    const tomato = await speciesId(ctx.db, 'tomato');
    const lot = await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots`).send({
      speciesId: tomato,
      variety: 'Reminder lot',
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount: 200,
    });
    testCode = lot.body.lot.code;
    await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots/${lot.body.lot.id}/tests`).send({
      startDate: '2026-03-01',
      method: 'paper towel',
      trays: [{ seedsSown: 25 }, { seedsSown: 25 }],
    });
    // The viewer opts in to check-day mail and the owner keeps the default (on), but the test is
    // the grower's: its check days are mailed to the grower alone (reminders-fit.test.ts).
    expect(
      (await bank.viewer.agent.patch(`/api/banks/${bank.bankId}/reminders`).send({ checks: true })).body
        .preferences.checks,
    ).toBe(true);
  });
  afterAll(() => ctx.close());

  const reminders = (mailer = ctx.mailer) =>
    createReminders({
      db: ctx.db,
      databaseUrl: ctx.config.databaseUrl,
      mailer,
      clock: ctx.clock,
      appOrigin: ctx.config.appOrigin,
      viability: createViabilityService({ db: ctx.db }),
      retryDelaySeconds: 1,
      pollingIntervalSeconds: 0.5,
    });
  /**
   * Waits until the queue holds no reminder job waiting, retrying or running (pg-boss's job states
   * before 'completed'): from then on no further mail can go out, so a count of the mail is final.
   */
  const queueSettled = () =>
    expect
      .poll(
        async () => {
          const { rows } = await sql<{
            n: string;
          }>`select count(*) as n from pgboss.job where name = ${REMINDER_QUEUE} and state < 'completed'`.execute(
            ctx.db,
          );
          return Number(rows[0]!.n);
        },
        { timeout: 30_000, interval: 200 },
      )
      .toBe(0);
  const mailsAbout = async (text: string) =>
    (await readOutbox(process.env.OUTBOX_DIR!, 1000)).filter((m) => m.subject.includes(text));

  it('when the clock reaches a check day, then the one running the test gets exactly one mail', async () => {
    const jobs = reminders();
    await jobs.start();
    try {
      // Tomato's first count day is day 5 (REFERENCES.md, from memory): 2026-03-06.
      ctx.clock.set('2026-03-06T09:00:00Z');
      expect(await jobs.tick()).toBe(1);
      await waitForMail((m) => m.subject.includes(testCode) && m.to.includes(bank.grower.email));
      expect(await jobs.tick()).toBe(0);
      await queueSettled();
      const mails = (await mailsAbout(testCode)).filter((m) =>
        [bank.owner.email, bank.grower.email, bank.viewer.email].some((e) => m.to.includes(e)),
      );
      expect(mails.map((m) => m.to[0])).toEqual([bank.grower.email]);
      expect(mails[0]!.text).toMatch(/tray 1 \(25 sown\), tray 2 \(25 sown\)/);
    } finally {
      await jobs.stop();
    }
  });

  it('when the server restarts between planning and the sowing day, then the reminder is still sent once', async () => {
    ctx.clock.set('2026-03-07T09:00:00Z');
    const petunia = await speciesId(ctx.db, 'petunia');
    const lot = await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots`).send({
      speciesId: petunia,
      variety: 'Restart',
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount: 500,
    });
    const entry = await bank.grower.agent
      .post(`/api/banks/${bank.bankId}/plan`)
      .send({ season: 2026, speciesId: petunia, plantsWanted: 10, start: 'indoors', lotId: lot.body.lot.id });
    expect(entry.status).toBe(201);
    const sowFrom: string = entry.body.entry.sowFrom;
    const first = reminders();
    await first.start();
    await first.tick(); // nothing is due yet
    await first.stop();

    ctx.clock.set(`${sowFrom}T08:00:00Z`);
    const second = reminders();
    await second.start();
    try {
      expect(await second.tick()).toBe(2); // owner and grower: sowing reminders default on
      await waitForMail(
        (m) => m.subject.includes('Sowing time: Petunia') && m.to.includes(bank.grower.email),
      );
      expect(await second.tick()).toBe(0);
    } finally {
      await second.stop();
    }
    const again = reminders();
    await again.start();
    try {
      expect(await again.tick()).toBe(0);
      await queueSettled();
    } finally {
      await again.stop();
    }
    const mails = await mailsAbout('Sowing time: Petunia');
    expect(mails.filter((m) => m.to.includes(bank.grower.email))).toHaveLength(1);
    expect(mails.filter((m) => m.to.includes(bank.owner.email))).toHaveLength(1);
  });

  it('when the mail server is down, then the reminder is retried and delivered once it is back, never twice', async () => {
    const port = await freePort();
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-smtp-late-'));
    const mailer = createMailer({ ...ctx.config.mail, port });
    const jobs = reminders(mailer);
    await jobs.start();
    let smtp: SMTPServer | null = null;
    try {
      // The final count day, 14 (from memory): 2026-03-15, a new check reminder for the grower.
      ctx.clock.set('2026-03-15T09:00:00Z');
      expect(await jobs.tick()).toBe(1);
      // A send or two fail while nothing listens.
      const failedRows = () =>
        ctx.db
          .selectFrom('reminders')
          .select(['attempts', 'sent_at'])
          .where('due_on', '=', '2026-03-15')
          .execute();
      await expect
        .poll(async () => (await failedRows()).some((r) => r.attempts >= 1), {
          timeout: 30_000,
          interval: 200,
        })
        .toBe(true);
      const failed = await failedRows();
      expect(failed.every((r) => r.sent_at === null)).toBe(true);
      expect(failed.some((r) => r.attempts >= 1)).toBe(true);

      const received: string[] = [];
      smtp = new SMTPServer({
        authOptional: true,
        disabledCommands: ['STARTTLS'],
        onData(stream, session, callback) {
          stream.on('data', () => {});
          stream.on('end', () => {
            received.push(session.envelope.rcptTo.map((r) => r.address).join(','));
            callback();
          });
        },
      });
      await new Promise<void>((resolve) => smtp!.listen(port, '127.0.0.1', resolve));
      // Retries back off from 1 s, doubling: the next one may be some seconds away.
      await expect.poll(() => received.length, { timeout: 40_000, interval: 250 }).toBeGreaterThanOrEqual(1);
      await queueSettled();
      expect(received).toEqual([bank.grower.email]);
      const rows = await ctx.db
        .selectFrom('reminders')
        .select('sent_at')
        .where('due_on', '=', '2026-03-15')
        .execute();
      expect(rows.every((r) => r.sent_at !== null)).toBe(true);
    } finally {
      await jobs.stop();
      mailer.close();
      await new Promise((r) => (smtp ? smtp.close(() => r(null)) : r(null)));
      fs.rmSync(dir, { recursive: true, force: true });
    }
  }, 90_000);
});
