import { sql } from 'kysely';
import type { Agent } from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addDays } from '#shared/dates';
import { REMINDER_QUEUE } from '#server/jobs/reminders';
import { readOutbox } from '#server/mail/outbox';
import { createReminders, createRemindersService } from '#server/modules/reminders/reminders.service';
import { createViabilityService } from '#server/modules/viability/viability.service';
import { bankWithRoles, signUp } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId } from '../helpers/lots';
import { waitForMail } from '../helpers/outbox';

// Reminders that fit: a tray check-day reminder goes to the member running the test (its starter
// unless changed), is skipped once that day's counts are saved (at the scan and again at the send),
// and every reminder goes out from the member's own hour on the bank's clock.
describe('reminders that fit the member', () => {
  let ctx: TestContext;
  /** Tomato's first and final count days, as the reference species gives them (REFERENCES.md). */
  let firstDay: number;
  let finalDay: number;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-03-01T09:00:00Z' });
    // Check days are reckoned from the reference species' count days, read as a member reads them.
    const bank = await bankWithRoles(ctx.app, ctx.db);
    const species = await bank.owner.agent.get(`/api/banks/${bank.bankId}/species?limit=500`);
    const tomato = species.body.items.find((s: { commonName: string }) => s.commonName === 'Tomato');
    firstDay = tomato.traits.firstCountDay;
    finalDay = tomato.traits.finalCountDay;
  });
  afterAll(() => ctx.close());

  const deps = () => ({
    db: ctx.db,
    mailer: ctx.mailer,
    clock: ctx.clock,
    appOrigin: ctx.config.appOrigin,
    viability: createViabilityService({ db: ctx.db }),
  });
  /** The reminders on the real pg-boss queue, as the server runs them. */
  const queue = () =>
    createReminders({
      ...deps(),
      databaseUrl: ctx.config.databaseUrl,
      retryDelaySeconds: 1,
      pollingIntervalSeconds: 0.5,
    });
  /**
   * The reminders service alone: its scan writes the rows and hands each id to us instead of a
   * queue, so a test can change the test between the queueing and the send, then send.
   */
  const scanOnly = async () => {
    const ids: string[] = [];
    const service = createRemindersService(deps());
    await service.queueDue(async (_trx, id) => {
      ids.push(id);
    });
    return { service, ids };
  };
  /** No reminder job waiting, retrying or running: from then on no more mail can go out. */
  const queueSettled = () =>
    expect
      .poll(
        async () => {
          const { rows } = await sql<{ n: string }>`
            select count(*) as n from pgboss.job where name = ${REMINDER_QUEUE} and state < 'completed'`.execute(
            ctx.db,
          );
          return Number(rows[0]!.n);
        },
        { timeout: 30_000, interval: 200 },
      )
      .toBe(0);
  const checkRows = (testId: string) =>
    ctx.db
      .selectFrom('reminders')
      .innerJoin('users', 'users.id', 'reminders.user_id')
      .select([
        'reminders.id',
        'reminders.due_on',
        'reminders.sent_at',
        'reminders.skipped_at',
        'reminders.skip_reason',
        'users.email',
      ])
      .where('reminders.kind', '=', 'check')
      .where('reminders.test_id', '=', testId)
      .orderBy('reminders.due_on')
      .execute();
  const mailTo = async (email: string, about: string) =>
    (await readOutbox(process.env.OUTBOX_DIR!, 2000)).filter(
      (m) => m.to.includes(email) && m.subject.includes(about),
    );

  /** A tomato lot and a running test of `trays` trays, started by `agent` on `startDate`. */
  async function startTest(agent: Agent, bankId: string, startDate: string, trays = 2) {
    const lot = await agent.post(`/api/banks/${bankId}/lots`).send({
      speciesId: await speciesId(ctx.db, 'tomato'),
      variety: 'Runner check',
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount: 500,
    });
    expect(lot.status, JSON.stringify(lot.body)).toBe(201);
    const test = await agent.post(`/api/banks/${bankId}/lots/${lot.body.lot.id}/tests`).send({
      startDate,
      method: 'paper towel',
      trays: Array.from({ length: trays }, () => ({ seedsSown: 25 })),
    });
    expect(test.status, JSON.stringify(test.body)).toBe(201);
    return {
      id: test.body.test.id as string,
      code: lot.body.lot.code as string,
      trayIds: test.body.trays.map((t: { id: string }) => t.id) as string[],
    };
  }
  const count = (agent: Agent, bankId: string, testId: string, date: string, trayIds: string[]) =>
    agent
      .post(`/api/banks/${bankId}/tests/${testId}/counts`)
      .send({ date, trays: trayIds.map((trayId) => ({ trayId, cumulative: 3 })) });

  /** A second grower added to the bank (straight into the table; invitations have tests of their own). */
  async function addGrower(bankId: string, name: string) {
    const person = await signUp(ctx.app, { name });
    await ctx.db
      .insertInto('memberships')
      .values({ bank_id: bankId, user_id: person.user.id, role: 'grower' })
      .execute();
    await ctx.changeFeed.sync();
    return person;
  }

  it('when the species is read, then its count days are there to reckon check days from', () => {
    // REFERENCES.md gives tomato 5 and 14 days, from memory: the tests read them from the API
    // rather than rely on them, and need only a first day and a final day more than 2 days later.
    expect(firstDay).toBeGreaterThan(0);
    expect(finalDay - firstDay).toBeGreaterThan(2);
  });

  it('when a grower starts a test, then only they get its check-day mail; after the owner hands it on, only the new runner', async () => {
    ctx.clock.set('2026-03-01T09:00:00Z');
    const bank = await bankWithRoles(ctx.app, ctx.db);
    const second = await addGrower(bank.bankId, 'Second grower');
    // The owner keeps check reminders on (the default); the viewer turns them on: neither runs the test.
    await bank.viewer.agent.patch(`/api/banks/${bank.bankId}/reminders`).send({ checks: true });
    const test = await startTest(bank.grower.agent, bank.bankId, '2026-03-01');
    const read = await bank.viewer.agent.get(`/api/banks/${bank.bankId}/tests/${test.id}`);
    expect(read.body.test.runnerId).toBe(bank.grower.user.id);
    expect(read.body.test.runnerName).toBe('Grower');

    const jobs = queue();
    await jobs.start();
    try {
      const first = addDays('2026-03-01', firstDay);
      ctx.clock.set(`${first}T09:00:00Z`);
      await jobs.tick();
      await waitForMail((m) => m.to.includes(bank.grower.email) && m.subject.includes(test.code));
      await queueSettled();
      expect((await checkRows(test.id)).map((r) => [r.due_on, r.email])).toEqual([
        [first, bank.grower.email],
      ]);
      for (const other of [bank.owner.email, bank.viewer.email, second.email])
        expect(await mailTo(other, test.code)).toEqual([]);
      const mail = (await mailTo(bank.grower.email, test.code))[0]!;
      expect(mail.text).toContain('You get this because you run this test');

      const handed = await bank.owner.agent
        .patch(`/api/banks/${bank.bankId}/tests/${test.id}`)
        .send({ runnerId: second.user.id });
      expect(handed.status, JSON.stringify(handed.body)).toBe(200);
      expect(handed.body.test.runnerId).toBe(second.user.id);
      expect(handed.body.test.runnerName).toBe('Second grower');

      const final = addDays('2026-03-01', finalDay);
      ctx.clock.set(`${final}T09:00:00Z`);
      await jobs.tick();
      await waitForMail((m) => m.to.includes(second.email) && m.subject.includes(test.code));
      await queueSettled();
      const rows = await checkRows(test.id);
      expect(rows.filter((r) => r.due_on === final).map((r) => r.email)).toEqual([second.email]);
      expect(await mailTo(bank.grower.email, test.code)).toHaveLength(1);
      for (const other of [bank.owner.email, bank.viewer.email])
        expect(await mailTo(other, test.code)).toEqual([]);
    } finally {
      await jobs.stop();
    }
  });

  // Dates in words as on every screen (shared/day-words.ts: "3 Jun 2026"), written out by hand here.
  it('when Monday’s digest lists a check day, then it gives the day in words and who runs the test', async () => {
    ctx.clock.set('2026-06-01T09:00:00Z'); // a Monday
    const bank = await bankWithRoles(ctx.app, ctx.db);
    // Started so that its first count falls on Wednesday 3 June 2026.
    const test = await startTest(bank.grower.agent, bank.bankId, addDays('2026-06-03', -firstDay));
    await scanOnly();
    const digest = await ctx.db
      .selectFrom('reminders')
      .select(['subject', 'body'])
      .where('bank_id', '=', bank.bankId)
      .where('kind', '=', 'digest')
      .executeTakeFirstOrThrow();
    expect(digest.body).toContain('from 1 Jun 2026 to 7 Jun 2026:');
    expect(digest.body).toContain(`- Count test ${test.code} on 3 Jun 2026, run by Grower`);
    expect(digest.body).not.toMatch(/\d{4}-\d{2}-\d{2}/);
  });

  it('when that day is already counted, then the scan writes no check-day reminder; a tray still to count keeps it', async () => {
    ctx.clock.set('2026-04-01T09:00:00Z');
    const bank = await bankWithRoles(ctx.app, ctx.db);
    const counted = await startTest(bank.grower.agent, bank.bankId, '2026-04-01');
    const half = await startTest(bank.grower.agent, bank.bankId, '2026-04-01');
    const day = addDays('2026-04-01', firstDay);
    ctx.clock.set(`${day}T09:00:00Z`);
    expect((await count(bank.grower.agent, bank.bankId, counted.id, day, counted.trayIds)).status).toBe(201);
    expect((await count(bank.grower.agent, bank.bankId, half.id, day, half.trayIds.slice(0, 1))).status).toBe(
      201,
    );
    await scanOnly();
    expect(await checkRows(counted.id)).toEqual([]);
    expect((await checkRows(half.id)).map((r) => r.email)).toEqual([bank.grower.email]);
    // A count saved a day late covers the missed day too: the catch-up scan writes nothing for it.
    const late = await startTest(bank.grower.agent, bank.bankId, '2026-04-01');
    ctx.clock.set(`${addDays(day, 1)}T09:00:00Z`);
    expect((await count(bank.grower.agent, bank.bankId, late.id, addDays(day, 1), late.trayIds)).status).toBe(
      201,
    );
    await scanOnly();
    expect(await checkRows(late.id)).toEqual([]);
  });

  it('when the day is counted or the test handed on after the reminder was queued, then the send skips it', async () => {
    ctx.clock.set('2026-05-01T09:00:00Z');
    const bank = await bankWithRoles(ctx.app, ctx.db);
    const countedLater = await startTest(bank.grower.agent, bank.bankId, '2026-05-01');
    const handedLater = await startTest(bank.grower.agent, bank.bankId, '2026-05-01');
    const stillDue = await startTest(bank.grower.agent, bank.bankId, '2026-05-01');
    const day = addDays('2026-05-01', firstDay);
    ctx.clock.set(`${day}T09:00:00Z`);
    const { service } = await scanOnly();
    const rowOf = async (testId: string) => {
      const rows = await checkRows(testId);
      expect(rows.map((r) => r.email)).toEqual([bank.grower.email]);
      return rows[0]!;
    };
    const a = await rowOf(countedLater.id);
    const b = await rowOf(handedLater.id);
    const c = await rowOf(stillDue.id);

    // Between the queueing and the send: one test's counts are saved, another gets a new runner.
    expect(
      (await count(bank.grower.agent, bank.bankId, countedLater.id, day, countedLater.trayIds)).status,
    ).toBe(201);
    expect(
      (
        await bank.owner.agent
          .patch(`/api/banks/${bank.bankId}/tests/${handedLater.id}`)
          .send({ runnerId: bank.owner.user.id })
      ).status,
    ).toBe(200);
    for (const row of [a, b, c]) await service.deliver(row.id);

    await waitForMail((m) => m.to.includes(bank.grower.email) && m.subject.includes(stillDue.code));
    const after = async (testId: string) =>
      (await checkRows(testId)).find((r) => r.email === bank.grower.email)!;
    expect(await after(countedLater.id)).toMatchObject({ sent_at: null, skip_reason: 'the day was counted' });
    expect((await after(countedLater.id)).skipped_at).not.toBeNull();
    expect(await after(handedLater.id)).toMatchObject({
      sent_at: null,
      skip_reason: 'someone else runs the test now',
    });
    expect((await after(stillDue.id)).sent_at).not.toBeNull();
    // A skipped reminder is never sent later either.
    await service.deliver(a.id);
    expect(await mailTo(bank.grower.email, countedLater.code)).toEqual([]);
    expect(await mailTo(bank.grower.email, handedLater.code)).toEqual([]);
    // The new runner's own reminder for the day comes with the next scan.
    await scanOnly();
    expect((await checkRows(handedLater.id)).map((r) => r.email).sort()).toEqual(
      [bank.grower.email, bank.owner.email].sort(),
    );
  });

  it('when the runner has left the bank, then the check-day reminder goes to the owners, who can hand the test on', async () => {
    ctx.clock.set('2026-05-01T09:00:00Z');
    const bank = await bankWithRoles(ctx.app, ctx.db);
    const test = await startTest(bank.grower.agent, bank.bankId, '2026-05-01');
    const removed = await bank.owner.agent.delete(`/api/banks/${bank.bankId}/members/${bank.grower.user.id}`);
    expect(removed.status).toBe(204);
    ctx.clock.set(`${addDays('2026-05-01', firstDay)}T09:00:00Z`);
    const { service } = await scanOnly();
    const rows = await checkRows(test.id);
    expect(rows.map((r) => r.email)).toEqual([bank.owner.email]);
    await service.deliver(rows[0]!.id);
    const mail = await waitForMail((m) => m.to.includes(bank.owner.email) && m.subject.includes(test.code));
    expect(mail.text).toContain('You get this as an owner: whoever ran this test can no longer count it.');
    // The test still names its runner; the owner hands it to someone who can count it.
    const read = await bank.owner.agent.get(`/api/banks/${bank.bankId}/tests/${test.id}`);
    expect(read.body.test.runnerId).toBe(bank.grower.user.id);
  });

  it("when a member chooses 18:00 and the bank is on Helsinki's clock, then the reminder waits for 18:00 there", async () => {
    ctx.clock.set('2026-03-01T09:00:00Z');
    const bank = await bankWithRoles(ctx.app, ctx.db);
    const zoned = await bank.owner.agent
      .patch(`/api/banks/${bank.bankId}`)
      .send({ timeZone: 'Europe/Helsinki' });
    expect(zoned.status, JSON.stringify(zoned.body)).toBe(200);
    expect((await bank.owner.agent.get(`/api/banks/${bank.bankId}/reminders`)).body.preferences.hour).toBe(7);
    const chosen = await bank.grower.agent.patch(`/api/banks/${bank.bankId}/reminders`).send({ hour: 18 });
    expect(chosen.status).toBe(200);
    expect(chosen.body.preferences).toMatchObject({ hour: 18, checks: true });
    expect((await bank.grower.agent.get(`/api/banks/${bank.bankId}/reminders`)).body.preferences.hour).toBe(
      18,
    );

    const test = await startTest(bank.grower.agent, bank.bankId, '2026-03-01');
    const day = addDays('2026-03-01', firstDay);
    // IANA tz database: Europe/Helsinki is UTC+2 (EET) until summer time begins on the last Sunday
    // of March (EU Directive 2000/84/EC; 2026-03-29), so 18:00 there is 16:00 UTC. At 15:59 UTC it
    // is 17:59 in Helsinki: too early. At 16:00 UTC it is 18:00 there (while UTC's own hour, 16,
    // is still before 18: a UTC clock would wait two more hours).
    ctx.clock.set(`${day}T15:59:00Z`);
    await scanOnly();
    expect(await checkRows(test.id)).toEqual([]);
    ctx.clock.set(`${day}T16:00:00Z`);
    const { service, ids } = await scanOnly();
    const rows = await checkRows(test.id);
    expect(rows.map((r) => r.email)).toEqual([bank.grower.email]);
    expect(ids).toContain(rows[0]!.id);
    await service.deliver(rows[0]!.id);
    const mail = await waitForMail((m) => m.to.includes(bank.grower.email) && m.subject.includes(test.code));
    expect(mail.text).toContain("at 6 p.m. on the bank's clock (Europe/Helsinki)");
  });

  it('when the runner or the hour is not valid, then the answer is a clear 4xx and nothing changes', async () => {
    ctx.clock.set('2026-06-01T09:00:00Z');
    const bank = await bankWithRoles(ctx.app, ctx.db);
    const test = await startTest(bank.grower.agent, bank.bankId, '2026-06-01');
    const patch = (agent: Agent, body: unknown) =>
      agent.patch(`/api/banks/${bank.bankId}/tests/${test.id}`).send(body as object);

    const viewer = await patch(bank.owner.agent, { runnerId: bank.viewer.user.id });
    expect(viewer.status).toBe(422);
    expect(viewer.body.error.code).toBe('impossible');
    expect(viewer.body.error.message).toMatch(/viewer cannot run a test/);
    expect(viewer.body.error.fields.runnerId).toBe('Choose an owner or grower of this bank.');
    const outsider = await patch(bank.owner.agent, { runnerId: bank.outsider.user.id });
    expect(outsider.status).toBe(422);
    expect(outsider.body.error.message).toMatch(/not a member of this bank/);
    const malformed = await patch(bank.owner.agent, { runnerId: 'someone' });
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.fields.runnerId).toBe('Not a valid id.');
    expect((await patch(bank.viewer.agent, { runnerId: bank.viewer.user.id })).status).toBe(403);
    const read = await bank.grower.agent.get(`/api/banks/${bank.bankId}/tests/${test.id}`);
    expect(read.body.test.runnerId).toBe(bank.grower.user.id);

    for (const hour of [24, -1, 7.5, '7', null]) {
      const res = await bank.grower.agent.patch(`/api/banks/${bank.bankId}/reminders`).send({ hour });
      expect(res.status, JSON.stringify(hour)).toBe(400);
      expect(res.body.error.fields.hour).toBe('Give the hour as a whole number from 0 to 23.');
    }
    expect((await bank.grower.agent.get(`/api/banks/${bank.bankId}/reminders`)).body.preferences.hour).toBe(
      7,
    );
  });
});
