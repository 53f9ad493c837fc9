import crypto from 'node:crypto';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signUp } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { finishedAssay, speciesId } from '../helpers/lots';
import { waitForMail } from '../helpers/outbox';

// Offers of part of a lot between banks. The people and banks are invented. The clock
// stands at 1 March 2026 (tests/helpers/context.ts).

type Agent = Awaited<ReturnType<typeof signUp>>['agent'];

/** The sum of a lot's stock ledger, read straight from the table (what "moved" means here). */
async function ledger(ctx: TestContext, lotId: string) {
  const rows = await ctx.db
    .selectFrom('stock_movements')
    .select(['kind', 'change'])
    .where('lot_id', '=', lotId)
    .execute();
  return { sum: rows.reduce((s, r) => s + r.change, 0), lines: rows.length, rows };
}

const lotsOfBank = async (ctx: TestContext, bankId: string) =>
  (await ctx.db.selectFrom('lots').select('id').where('bank_id', '=', bankId).execute()).length;

describe('offers between banks', () => {
  let ctx: TestContext;
  let giver: Awaited<ReturnType<typeof signUp>>; // owner of Hill Row Circle and of Fern Lane
  let stranger: Awaited<ReturnType<typeof signUp>>; // owner of Far Field only
  let circleMate: Awaited<ReturnType<typeof signUp>>; // grower of Hill Row Circle only
  let viewerOfB: Awaited<ReturnType<typeof signUp>>;
  let growerOfB: Awaited<ReturnType<typeof signUp>>; // grower of Fern Lane only
  let bankA: string;
  let bankB: string;
  let bankC: string;
  const PRIVATE_NOTE = 'Private: picked from the plant by the compost heap';
  const PRIVATE_TEST_NOTE = 'Private: towel dried out on day 3, kept going';

  beforeAll(async () => {
    ctx = await createTestContext();
    giver = await signUp(ctx.app, { name: 'Ada Quillfeather' });
    stranger = await signUp(ctx.app, { name: 'Bram Ostwick' });
    circleMate = await signUp(ctx.app, { name: 'Cleo Marrowby' });
    viewerOfB = await signUp(ctx.app, { name: 'Dov Viewer' });
    growerOfB = await signUp(ctx.app, { name: 'Esme Grower' });
    bankA = (await giver.agent.post('/api/banks').send({ name: 'Hill Row Circle' })).body.bank.id;
    bankB = (await giver.agent.post('/api/banks').send({ name: 'Fern Lane' })).body.bank.id;
    bankC = (await stranger.agent.post('/api/banks').send({ name: 'Far Field' })).body.bank.id;
    await ctx.db
      .insertInto('memberships')
      .values([
        { bank_id: bankA, user_id: circleMate.user.id, role: 'grower' },
        { bank_id: bankB, user_id: viewerOfB.user.id, role: 'viewer' },
        { bank_id: bankB, user_id: growerOfB.user.id, role: 'grower' },
      ])
      .execute();
    await ctx.changeFeed.sync();
  });
  afterAll(() => ctx.close());

  /**
   * A tomato lot of 200 counted seeds in Hill Row Circle with a private note and one finished test of
   * two trays, 46 and 45 of 50 normal seedlings, whose own note is private too.
   */
  async function testedLot(variety = 'Ridgeback Rose') {
    const created = await giver.agent.post(`/api/banks/${bankA}/lots`).send({
      speciesId: await speciesId(ctx.db, 'tomato'),
      variety,
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount: 200,
      notes: PRIVATE_NOTE,
      storage: { place: 'fridge', location: 'Blue tin on the top shelf' },
    });
    expect(created.status).toBe(201);
    const lotId: string = created.body.lot.id;
    const testId = await finishedAssay(giver.agent, bankA, lotId, '2025-10-01', [
      { sown: 50, germinated: 46 },
      { sown: 50, germinated: 45 },
    ]);
    await ctx.db
      .updateTable('germination_tests')
      .set({ notes: PRIVATE_TEST_NOTE })
      .where('id', '=', testId)
      .execute();
    await ctx.changeFeed.sync();
    const trayIds = (
      await ctx.db.selectFrom('test_trays').select('id').where('test_id', '=', testId).execute()
    ).map((t) => t.id);
    // The test took its 100 seeds out of the ledger: 100 remain.
    return { lotId, code: created.body.lot.code as string, testId, trayIds };
  }

  const offer = (agent: Agent, lotId: string, body: object) =>
    agent.post(`/api/banks/${bankA}/lots/${lotId}/offers`).send(body);

  it('when an offer to another of the giver’s banks is accepted, then the seeds move exactly once and a second accept is refused', async () => {
    const { lotId, code } = await testedLot();
    const before = await ledger(ctx, lotId);
    expect(before.sum).toBe(100); // 200 logged − 100 sown in the test's two trays
    const made = await offer(giver.agent, lotId, { seeds: 60, toBankId: bankB });
    expect(made.status).toBe(201);
    expect(made.body.offer.link).toBeUndefined();
    // An open offer moves nothing.
    expect((await ledger(ctx, lotId)).sum).toBe(100);

    const accepted = await giver.agent
      .post(`/api/offers/${made.body.offer.id}/accept`)
      .send({ bankId: bankB });
    expect(accepted.status).toBe(201);
    const lot = accepted.body.lot;
    expect(lot.seedsOnHand).toBe(60);
    expect(lot.origin).toBe('swapped');
    expect(lot.harvestDate).toBe('2025-09-01');
    expect(lot.sourceName).toBe(`Lot ${code} of Hill Row Circle`);

    const giverAfter = await ledger(ctx, lotId);
    const receiverAfter = await ledger(ctx, lot.id);
    expect(giverAfter.sum).toBe(40);
    expect(giverAfter.lines).toBe(before.lines + 1);
    expect(giverAfter.rows.filter((r) => r.kind === 'given')).toEqual([{ kind: 'given', change: -60 }]);
    expect(receiverAfter.rows).toEqual([{ kind: 'initial', change: 60 }]);
    // Both lines are dated the day the offer was accepted (the test clock's 1 March 2026), not the harvest.
    const stockB = await giver.agent.get(`/api/banks/${bankB}/lots/${lot.id}/stock`);
    expect(stockB.body.items.map((m: { date: string }) => m.date)).toEqual(['2026-03-01']);
    const stockA = await giver.agent.get(`/api/banks/${bankA}/lots/${lotId}/stock`);
    expect(stockA.body.items.find((m: { kind: string }) => m.kind === 'given').date).toBe('2026-03-01');
    // Nothing lost or counted twice: the two ledgers still hold the 100 seeds there were.
    expect(giverAfter.sum + receiverAfter.sum).toBe(before.sum);

    const again = await giver.agent.post(`/api/offers/${made.body.offer.id}/accept`).send({ bankId: bankB });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('offer_accepted');
    expect((await ledger(ctx, lotId)).sum).toBe(40);
    expect((await ledger(ctx, lot.id)).sum).toBe(60);
    expect(await ctx.db.selectFrom('lots').select('id').where('bank_id', '=', bankB).execute()).toHaveLength(
      1,
    );

    // Both sides read it over HTTP: the giver's lot has 40 left, the giver's offer list says accepted.
    expect((await giver.agent.get(`/api/banks/${bankA}/lots/${lotId}`)).body.lot.seedsOnHand).toBe(40);
    const listed = await giver.agent.get(`/api/banks/${bankA}/lots/${lotId}/offers`);
    expect(listed.body.items.map((o: { status: string }) => o.status)).toEqual(['accepted']);
  });

  it('when a lot is received, then its history is the giver’s tests and no private field of the giver crosses', async () => {
    const { lotId, code, testId, trayIds } = await testedLot('Cherokee Dusk');
    const made = await offer(giver.agent, lotId, { seeds: 30, toBankId: bankB });
    const accepted = await growerOfB.agent
      .post(`/api/offers/${made.body.offer.id}/accept`)
      .send({ bankId: bankB });
    expect(accepted.status).toBe(201);
    const received = accepted.body.lot;
    expect(received.notes).toBeNull();
    expect(received.storage).toEqual({ place: null, location: null, temperatureC: null, humidityPct: null });
    expect(received.parentPlantIds).toEqual([]);

    const history = await growerOfB.agent.get(`/api/banks/${bankB}/lots/${received.id}/received`);
    expect(history.status).toBe(200);
    expect(history.body.received.giverLotCode).toBe(code);
    expect(history.body.received.giverBankName).toBe('Hill Row Circle');
    expect(history.body.received.seeds).toBe(30);
    expect(history.body.received.tests).toHaveLength(1);
    const [t] = history.body.received.tests;
    // Pooled germination = normal seedlings / seeds sown over the replicates (ISTA Rules ch. 5, the
    // percentage by number [memory]; here 46 + 45 of 50 + 50 by hand): 91 of 100.
    expect(t).toMatchObject({ startDate: '2025-10-01', sown: 100, germinated: 91, trays: 2 });
    expect(t.percent).toBeCloseTo(91, 10);
    // The receiving bank's ranking decides with it as the lot's test.
    const ranking = await growerOfB.agent.get(`/api/banks/${bankB}/ranking?on=2026-03-01`);
    const row = ranking.body.items.find((r: { lotId: string }) => r.lotId === received.id);
    expect(row.lastTestDate).toBe('2025-10-01');
    expect(row.lastPercent).toBeCloseTo(91, 10);
    expect(row.recommendation).not.toBe('retest');

    // Nothing private of the giver, nor the giver's own ids, in anything the receiving bank reads.
    const everything = JSON.stringify([
      received,
      history.body,
      (await growerOfB.agent.get(`/api/banks/${bankB}/lots/${received.id}/viability?on=2026-03-01`)).body,
      (await growerOfB.agent.get(`/api/banks/${bankB}/lots/${received.id}/stock`)).body,
      await ctx.db.selectFrom('received_tests').selectAll().where('lot_id', '=', received.id).execute(),
    ]);
    for (const secret of [
      PRIVATE_NOTE,
      PRIVATE_TEST_NOTE,
      'Blue tin',
      'Ada Quillfeather',
      testId,
      ...trayIds,
      lotId,
    ]) {
      expect(everything).not.toContain(secret);
    }
  });

  it('when two accepts of one offer race, then exactly one goes through and the seeds move once', async () => {
    const { lotId } = await testedLot('Racing Roma');
    const made = await offer(giver.agent, lotId, { seeds: 40, toBankId: bankB });
    const before = await ledger(ctx, lotId);
    const lotsInB = await lotsOfBank(ctx, bankB);
    const answers = await Promise.all(
      [giver, growerOfB].map((p) =>
        p.agent.post(`/api/offers/${made.body.offer.id}/accept`).send({ bankId: bankB }),
      ),
    );
    expect(answers.map((a) => a.status).sort()).toEqual([201, 409]);
    expect((await ledger(ctx, lotId)).sum).toBe(before.sum - 40);
    expect(await lotsOfBank(ctx, bankB)).toBe(lotsInB + 1);
  });

  it('when the giver hides the bank’s name, then the receiver sees only the lot’s code', async () => {
    const { lotId, code } = await testedLot('Golden Wren');
    const made = await offer(giver.agent, lotId, { seeds: 10, toBankId: bankB, showBankName: false });
    const accepted = await giver.agent
      .post(`/api/offers/${made.body.offer.id}/accept`)
      .send({ bankId: bankB });
    expect(accepted.body.lot.sourceName).toBe(`Lot ${code} of another Hilum bank`);
    const history = await giver.agent.get(`/api/banks/${bankB}/lots/${accepted.body.lot.id}/received`);
    expect(history.body.received.giverBankName).toBeNull();
    expect(JSON.stringify([accepted.body, history.body])).not.toContain('Hill Row Circle');
  });

  it('when the receiving side fails in the middle of an accept, then neither ledger moved and the offer stays open', async () => {
    const { lotId } = await testedLot('Failing Fenwick');
    const made = await offer(giver.agent, lotId, { seeds: 25, toBankId: bankB });
    const lotsInB = await lotsOfBank(ctx, bankB);
    const before = await ledger(ctx, lotId);
    // A real constraint violation from PostgreSQL on the receiver's first ledger line, written after
    // the giver's seeds were taken out and the new lot was inserted.
    await sql`alter table stock_movements add constraint injected_receiving_failure
      check (not (kind = 'initial' and reason like 'Received %')) not valid`.execute(ctx.db);
    try {
      const failed = await giver.agent
        .post(`/api/offers/${made.body.offer.id}/accept`)
        .send({ bankId: bankB });
      expect(failed.status).toBe(500);
      expect(failed.body.error.code).toBe('internal');
    } finally {
      await sql`alter table stock_movements drop constraint injected_receiving_failure`.execute(ctx.db);
    }
    expect(await ledger(ctx, lotId)).toEqual(before);
    expect(await lotsOfBank(ctx, bankB)).toBe(lotsInB);
    const row = await ctx.db
      .selectFrom('lot_offers')
      .select('status')
      .where('id', '=', made.body.offer.id)
      .executeTakeFirstOrThrow();
    expect(row.status).toBe('open');

    // Once the fault is gone, the same offer goes through, once.
    const accepted = await giver.agent
      .post(`/api/offers/${made.body.offer.id}/accept`)
      .send({ bankId: bankB });
    expect(accepted.status).toBe(201);
    expect((await ledger(ctx, lotId)).sum).toBe(before.sum - 25);
    expect((await ledger(ctx, accepted.body.lot.id)).sum).toBe(25);
    expect(await lotsOfBank(ctx, bankB)).toBe(lotsInB + 1);
  });

  it('when an offer is declined, then nothing moves and it cannot be accepted after', async () => {
    const { lotId } = await testedLot('Declined Damask');
    const made = await offer(giver.agent, lotId, { seeds: 20, toBankId: bankB });
    const before = await ledger(ctx, lotId);
    const lotsInB = await lotsOfBank(ctx, bankB);
    // A viewer of the receiving bank cannot decline for it.
    expect((await viewerOfB.agent.post(`/api/offers/${made.body.offer.id}/decline`).send({})).status).toBe(
      403,
    );
    const declined = await giver.agent.post(`/api/offers/${made.body.offer.id}/decline`);
    expect(declined.status).toBe(204);
    expect(await ledger(ctx, lotId)).toEqual(before);
    expect(await lotsOfBank(ctx, bankB)).toBe(lotsInB);
    const late = await giver.agent.post(`/api/offers/${made.body.offer.id}/accept`).send({ bankId: bankB });
    expect(late.status).toBe(409);
    expect(late.body.error.code).toBe('offer_closed');
    expect(await ledger(ctx, lotId)).toEqual(before);
  });

  it('when the giver withdraws an open offer, then it closes and nothing moved', async () => {
    const { lotId } = await testedLot('Withdrawn Wax');
    const made = await offer(giver.agent, lotId, { seeds: 5, toBankId: bankB });
    const before = await ledger(ctx, lotId);
    // A grower of the bank, not the one who made it, may withdraw too; a stranger finds nothing.
    expect(
      (await stranger.agent.delete(`/api/banks/${bankA}/lots/${lotId}/offers/${made.body.offer.id}`)).status,
    ).toBe(404);
    expect(
      (await circleMate.agent.delete(`/api/banks/${bankA}/lots/${lotId}/offers/${made.body.offer.id}`))
        .status,
    ).toBe(204);
    expect(
      (await giver.agent.delete(`/api/banks/${bankA}/lots/${lotId}/offers/${made.body.offer.id}`)).status,
    ).toBe(409);
    expect(
      (await giver.agent.post(`/api/offers/${made.body.offer.id}/accept`).send({ bankId: bankB })).status,
    ).toBe(409);
    expect(await ledger(ctx, lotId)).toEqual(before);
  });

  it('when someone who is not a member of the addressed bank tries to accept, then they are refused and nothing moves', async () => {
    const { lotId } = await testedLot('Guarded Gem');
    const made = await offer(giver.agent, lotId, { seeds: 15, toBankId: bankB });
    const id = made.body.offer.id;
    const before = await ledger(ctx, lotId);
    // Into the stranger's own bank: the offer is not theirs to see (404, never revealing it).
    const intoOwn = await stranger.agent.post(`/api/offers/${id}/accept`).send({ bankId: bankC });
    expect(intoOwn.status).toBe(404);
    // Into the addressed bank, of which the stranger is no member: 404 as for any bank not theirs.
    expect((await stranger.agent.post(`/api/offers/${id}/accept`).send({ bankId: bankB })).status).toBe(404);
    expect((await stranger.agent.get(`/api/offers/${id}`)).status).toBe(404);
    expect((await stranger.agent.post(`/api/offers/${id}/decline`)).status).toBe(404);
    // A viewer of the addressed bank may see it but not take it in.
    expect((await viewerOfB.agent.get(`/api/offers/${id}`)).status).toBe(200);
    expect((await viewerOfB.agent.post(`/api/offers/${id}/accept`).send({ bankId: bankB })).status).toBe(403);
    // A member of the giving bank cannot take it into the giving bank, nor into another.
    expect((await circleMate.agent.post(`/api/offers/${id}/accept`).send({ bankId: bankA })).status).toBe(
      404,
    );
    expect(await ledger(ctx, lotId)).toEqual(before);
    expect(
      (await ctx.db.selectFrom('lot_offers').select('status').where('id', '=', id).executeTakeFirstOrThrow())
        .status,
    ).toBe('open');
  });

  it('when an offer is made by link, then only a hash is kept and anyone with the link and a bank can accept it', async () => {
    const { lotId, code } = await testedLot('Linked Lemon');
    const made = await offer(giver.agent, lotId, { seeds: 12 });
    expect(made.status).toBe(201);
    const link = new URL(made.body.offer.link);
    expect(link.pathname).toBe(`/offers/${made.body.offer.id}`);
    const token = link.searchParams.get('token')!;
    // 32 random bytes in base64url, like the project's other link tokens (server/auth/tokens.ts).
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    const row = await ctx.db
      .selectFrom('lot_offers')
      .selectAll()
      .where('id', '=', made.body.offer.id)
      .executeTakeFirstOrThrow();
    expect(JSON.stringify(row)).not.toContain(token);
    // SHA-256 of the token, hex (Node's crypto, outside the code under test).
    expect(row.token_hash).toBe(crypto.createHash('sha256').update(token).digest('hex'));
    expect(row.expires_at!.toISOString()).toBe('2026-03-31T09:00:00.000Z'); // 30 days after the clock

    const id = made.body.offer.id;
    expect((await stranger.agent.get(`/api/offers/${id}`)).status).toBe(404);
    const preview = await stranger.agent.get(`/api/offers/${id}?token=${token}`);
    expect(preview.status).toBe(200);
    expect(preview.body.offer).toMatchObject({ giverLotCode: code, seeds: 12, variety: 'Linked Lemon' });
    expect(JSON.stringify(preview.body)).not.toContain(PRIVATE_NOTE);
    expect((await stranger.agent.post(`/api/offers/${id}/accept`).send({ bankId: bankC })).status).toBe(404);
    const wrong = token.slice(0, -1) + (token.endsWith('A') ? 'B' : 'A');
    expect(
      (await stranger.agent.post(`/api/offers/${id}/accept`).send({ bankId: bankC, token: wrong })).status,
    ).toBe(404);
    const accepted = await stranger.agent.post(`/api/offers/${id}/accept`).send({ bankId: bankC, token });
    expect(accepted.status).toBe(201);
    expect(accepted.body.lot.seedsOnHand).toBe(12);
    const given = (await ledger(ctx, lotId)).rows.find((r) => r.kind === 'given');
    expect(given).toEqual({ kind: 'given', change: -12 });
  });

  it('when the input is bad, then the answer is a clear 4xx in the error shape', async () => {
    const { lotId } = await testedLot('Bad Input Beefsteak');
    const cases: [object, number, string?][] = [
      [{ seeds: 0, toBankId: bankB }, 400, 'seeds'],
      [{ seeds: 2.5, toBankId: bankB }, 400, 'seeds'],
      [{ seeds: 'ten', toBankId: bankB }, 400, 'seeds'],
      [{ toBankId: bankB }, 400, 'seeds'],
      [{ seeds: 5, toBankId: 'bank-b' }, 400, 'toBankId'],
      [{ seeds: 5, toBankId: bankB, colour: 'red' }, 400],
      [{ seeds: 5, toBankId: bankC }, 422, 'toBankId'],
      [{ seeds: 5, toBankId: bankA }, 422, 'toBankId'],
      [{ seeds: 101, toBankId: bankB }, 409],
    ];
    for (const [body, status, field] of cases) {
      const res = await offer(giver.agent, lotId, body);
      expect(res.status, JSON.stringify(body)).toBe(status);
      expect(typeof res.body.error.message).toBe('string');
      if (field) expect(Object.keys(res.body.error.fields ?? {}), JSON.stringify(body)).toContain(field);
    }
    expect((await offer(giver.agent, lotId, { seeds: 101, toBankId: bankB })).body.error.code).toBe(
      'stock_below_zero',
    );
    // A viewer may not offer; a lot of another bank is not found.
    const made = await offer(giver.agent, lotId, { seeds: 5, toBankId: bankB });
    const id = made.body.offer.id;
    expect((await giver.agent.post(`/api/offers/${id}/accept`).send({})).status).toBe(400);
    expect(
      (await giver.agent.post(`/api/offers/${id}/accept`).send({ bankId: 'nope' })).body.error.fields,
    ).toHaveProperty('bankId');
    expect(
      (await giver.agent.post(`/api/offers/${id}/accept`).send({ bankId: bankB, token: 'short' })).status,
    ).toBe(400);
    expect((await giver.agent.post(`/api/offers/not-an-id/accept`).send({ bankId: bankB })).status).toBe(404);
    expect(
      (await giver.agent.post(`/api/offers/${crypto.randomUUID()}/accept`).send({ bankId: bankB })).status,
    ).toBe(404);
    // Into the bank the seed is in already.
    const link = await offer(giver.agent, lotId, { seeds: 5 });
    const token = new URL(link.body.offer.link).searchParams.get('token')!;
    const home = await giver.agent
      .post(`/api/offers/${link.body.offer.id}/accept`)
      .send({ bankId: bankA, token });
    expect(home.status).toBe(422);
    expect(home.body.error.fields).toHaveProperty('bankId');
    expect(
      (await giver.agent.post(`/api/offers/${id}/requests`).send({ note: 'x'.repeat(501) })).status,
    ).toBe(400);
  });

  it('when members look at the circle’s list, then they see each lot’s latest germination and age and can ask for one', async () => {
    const { lotId, code } = await testedLot('Asked-for Amber');
    const made = await offer(giver.agent, lotId, { seeds: 8 });
    const list = await circleMate.agent.get('/api/offers');
    expect(list.status).toBe(200);
    const item = list.body.items.find((o: { id: string }) => o.id === made.body.offer.id);
    expect(item).toMatchObject({ lotCode: code, seeds: 8, fromBankName: 'Hill Row Circle', byLink: true });
    expect(item.lastTestDate).toBe('2025-10-01');
    expect(item.lastPercent).toBeCloseTo(91, 10);
    // Age from harvest (1 Sep 2025) to today (1 Mar 2026): 181 days over the mean year of 365.25 days.
    expect(item.ageYears).toBeCloseTo(181 / 365.25, 10);
    // Someone in none of the circle's banks sees none of its offers.
    const strangers = await stranger.agent.get('/api/offers');
    expect(strangers.body.items.map((o: { id: string }) => o.id)).not.toContain(made.body.offer.id);

    const asked = await circleMate.agent
      .post(`/api/offers/${made.body.offer.id}/requests`)
      .send({ note: 'For the school garden' });
    expect(asked.status).toBe(201);
    expect((await circleMate.agent.post(`/api/offers/${made.body.offer.id}/requests`).send({})).status).toBe(
      409,
    );
    expect((await stranger.agent.post(`/api/offers/${made.body.offer.id}/requests`).send({})).status).toBe(
      404,
    );
    const mail = await waitForMail((m) => m.to.includes(giver.email) && m.subject.includes(code));
    expect(mail.text).toContain('Cleo Marrowby');
    expect(mail.text).toContain('For the school garden');
    expect(mail.text).toMatch(/phytosanitary/);
    const seen = await giver.agent.get(`/api/banks/${bankA}/lots/${lotId}/offers`);
    expect(seen.body.items[0].requests).toMatchObject([
      { name: 'Cleo Marrowby', note: 'For the school garden' },
    ]);
    const again = await circleMate.agent.get('/api/offers');
    expect(again.body.items.find((o: { id: string }) => o.id === made.body.offer.id).askedByMe).toBe(true);
  });

  it('when lots of a species the giving bank added itself are accepted, then the receiving bank gets that species once, with its traits', async () => {
    // Last, as it adds lots to Fern Lane. An invented species of the giving bank, with count days of its own.
    const added = await giver.agent.post(`/api/banks/${bankA}/species`).send({
      commonName: 'Dusk trumpet',
      scientificName: 'Ipomoea vespertina',
      traits: { firstCountDay: 6, finalCountDay: 18 },
    });
    expect(added.status, JSON.stringify(added.body)).toBe(201);
    const received: { lotId: string; speciesId: string }[] = [];
    for (const variety of ['Pale Dusk', 'Deep Dusk']) {
      const lot = await giver.agent.post(`/api/banks/${bankA}/lots`).send({
        speciesId: added.body.species.id,
        variety,
        origin: 'saved',
        harvestDate: '2025-09-01',
        seedCount: 40,
      });
      expect(lot.status, JSON.stringify(lot.body)).toBe(201);
      const made = await offer(giver.agent, lot.body.lot.id, { seeds: 10, toBankId: bankB });
      expect(made.status, JSON.stringify(made.body)).toBe(201);
      const accepted = await growerOfB.agent
        .post(`/api/offers/${made.body.offer.id}/accept`)
        .send({ bankId: bankB });
      expect(accepted.status, JSON.stringify(accepted.body)).toBe(201);
      received.push({ lotId: accepted.body.lot.id, speciesId: accepted.body.lot.speciesId });
    }
    // One copy in the receiving bank, not the giver's row, and the second lot found it by its names.
    const [first, second] = received;
    expect(first!.speciesId).not.toBe(added.body.species.id);
    expect(second!.speciesId).toBe(first!.speciesId);
    const inB = await growerOfB.agent.get(`/api/banks/${bankB}/species?limit=500`);
    const copies = inB.body.items.filter((s: { commonName: string }) => s.commonName === 'Dusk trumpet');
    expect(copies).toHaveLength(1);
    expect(copies[0]).toMatchObject({
      id: first!.speciesId,
      scientificName: 'Ipomoea vespertina',
      reference: false,
      traits: { firstCountDay: 6, finalCountDay: 18 },
    });
    const lotInB = await growerOfB.agent.get(`/api/banks/${bankB}/lots/${first!.lotId}`);
    expect(lotInB.status).toBe(200);
    expect(lotInB.body.lot.seedsOnHand).toBe(10);
  });
});
