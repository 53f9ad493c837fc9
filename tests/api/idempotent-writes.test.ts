import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bankWithRoles } from '../helpers/accounts';
import { createTestContext, type TestContext } from '../helpers/context';
import { speciesId, startedAssay } from '../helpers/lots';

// A phone's queue of writes made offline sends each with an Idempotency-Key it made up; the server
// keeps the first answer per member and key, so a write sent again (its answer was lost on the way
// back, two tabs sent one queue) is not applied twice (server/http/idempotency.ts).
describe('writes sent again with the same Idempotency-Key', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let tomato: string;
  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-03-20T12:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db);
    tomato = await speciesId(ctx.db, 'tomato');
  });
  afterAll(() => ctx.close());

  const base = () => `/api/banks/${bank.bankId}`;
  const newKey = () => crypto.randomUUID();

  async function lotOf(seeds: number) {
    const res = await bank.grower.agent.post(`${base()}/lots`).send({
      speciesId: tomato,
      variety: 'Queue test',
      origin: 'saved',
      harvestDate: '2025-09-10',
      seedCount: seeds,
    });
    expect(res.status).toBe(201);
    return res.body.lot.id as string;
  }

  async function ledgerLines(lotId: string) {
    return ctx.db
      .selectFrom('stock_movements')
      .select(['change', 'reason'])
      .where('lot_id', '=', lotId)
      .execute();
  }

  it('when a stock withdrawal is sent twice with one key, then it is taken once and the repeat gets the first answer', async () => {
    const lotId = await lotOf(200);
    const key = newKey();
    const body = { change: -30, reason: 'sown in the cold frame', date: '2026-03-19', kind: 'sown' };
    const first = await bank.grower.agent
      .post(`${base()}/lots/${lotId}/stock`)
      .set('Idempotency-Key', key)
      .send(body);
    expect(first.status).toBe(201);
    expect(first.headers['idempotent-replayed']).toBeUndefined();
    const again = await bank.grower.agent
      .post(`${base()}/lots/${lotId}/stock`)
      .set('Idempotency-Key', key)
      .send(body);
    expect(again.status).toBe(201);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body).toEqual(first.body);
    // 200 counted in, 30 out once: one 'sown' line, and 170 on hand (not 140).
    expect((await ledgerLines(lotId)).filter((l) => l.change === -30)).toHaveLength(1);
    expect((await bank.viewer.agent.get(`${base()}/lots/${lotId}`)).body.lot.seedsOnHand).toBe(170);
  });

  it('when the same keyed write arrives five times at once, then it is applied exactly once', async () => {
    const lotId = await lotOf(100);
    const key = newKey();
    const body = { change: -10, reason: 'given to a neighbour', date: '2026-03-19', kind: 'given' };
    const answers = await Promise.all(
      Array.from({ length: 5 }, () =>
        bank.grower.agent.post(`${base()}/lots/${lotId}/stock`).set('Idempotency-Key', key).send(body),
      ),
    );
    // Each is the first answer (201) or "still being saved" (409, try again); none a second write.
    for (const answer of answers) {
      expect([201, 409]).toContain(answer.status);
      if (answer.status === 409) {
        expect(answer.body.error.code).toBe('request_in_progress');
        expect(Number(answer.headers['retry-after'])).toBeGreaterThan(0);
      }
    }
    expect(answers.filter((a) => a.status === 201).length).toBeGreaterThanOrEqual(1);
    const late = await bank.grower.agent
      .post(`${base()}/lots/${lotId}/stock`)
      .set('Idempotency-Key', key)
      .send(body);
    expect(late.status).toBe(201);
    expect((await ledgerLines(lotId)).filter((l) => l.change === -10)).toHaveLength(1);
  });

  it('when counts are sent again with their key, then the test keeps one count per tray and the answer is the first', async () => {
    const lotId = await lotOf(200);
    const { testId, trayIds } = await startedAssay(
      bank.grower.agent,
      bank.bankId,
      lotId,
      '2026-03-10',
      [50, 50],
    );
    const key = newKey();
    const body = {
      date: '2026-03-16',
      trays: [
        { trayId: trayIds[0], cumulative: 21 },
        { trayId: trayIds[1], cumulative: 19 },
      ],
    };
    const first = await bank.grower.agent
      .post(`${base()}/tests/${testId}/counts`)
      .set('Idempotency-Key', key)
      .send(body);
    expect(first.status).toBe(201);
    // Someone corrects tray 1 in between; the late repeat of the first write must not undo it.
    const corrected = await bank.grower.agent
      .post(`${base()}/tests/${testId}/counts`)
      .send({ date: '2026-03-16', trays: [{ trayId: trayIds[0], cumulative: 22 }] });
    expect(corrected.status).toBe(201);
    const again = await bank.grower.agent
      .post(`${base()}/tests/${testId}/counts`)
      .set('Idempotency-Key', key)
      .send(body);
    expect(again.status).toBe(201);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body).toEqual(first.body);
    const rows = await ctx.db
      .selectFrom('tray_counts')
      .select(['tray_id', 'cumulative'])
      .where('tray_id', 'in', trayIds)
      .where('check_date', '=', '2026-03-16')
      .orderBy('cumulative', 'desc')
      .execute();
    expect(rows).toEqual([
      { tray_id: trayIds[0], cumulative: 22 },
      { tray_id: trayIds[1], cumulative: 19 },
    ]);
  });

  it('when a keyed write was refused, then its repeat gets the same refusal and nothing is written', async () => {
    const lotId = await lotOf(20);
    const key = newKey();
    const body = { change: -50, reason: 'sown', date: '2026-03-19', kind: 'sown' };
    const first = await bank.grower.agent
      .post(`${base()}/lots/${lotId}/stock`)
      .set('Idempotency-Key', key)
      .send(body);
    expect(first.status).toBe(409);
    const again = await bank.grower.agent
      .post(`${base()}/lots/${lotId}/stock`)
      .set('Idempotency-Key', key)
      .send(body);
    expect(again.status).toBe(409);
    expect(again.body).toEqual(first.body);
    expect((await ledgerLines(lotId)).filter((l) => l.change < 0)).toEqual([]);
  });

  it('when a key is reused for a different write, then it is 422 and the second write is not applied', async () => {
    const lotId = await lotOf(100);
    const key = newKey();
    const path = `${base()}/lots/${lotId}/stock`;
    const sent = { change: -5, reason: 'sown', date: '2026-03-19', kind: 'sown' };
    expect((await bank.grower.agent.post(path).set('Idempotency-Key', key).send(sent)).status).toBe(201);
    const other = await bank.grower.agent
      .post(path)
      .set('Idempotency-Key', key)
      .send({ ...sent, change: -6 });
    expect(other.status).toBe(422);
    expect(other.body.error.code).toBe('idempotency_key_reused');
    expect((await ledgerLines(lotId)).filter((l) => l.change === -6)).toEqual([]);
  });

  it('when two members send the same key, then each write is their own and both are applied', async () => {
    const lotId = await lotOf(100);
    const key = newKey();
    const path = `${base()}/lots/${lotId}/stock`;
    const body = { change: -4, reason: 'sown', date: '2026-03-19', kind: 'sown' };
    expect((await bank.grower.agent.post(path).set('Idempotency-Key', key).send(body)).status).toBe(201);
    const owners = await bank.owner.agent.post(path).set('Idempotency-Key', key).send(body);
    expect(owners.status).toBe(201);
    expect(owners.headers['idempotent-replayed']).toBeUndefined();
    expect((await ledgerLines(lotId)).filter((l) => l.change === -4)).toHaveLength(2);
  });

  it('when the key is not a usable token, then it is a 400 in the error shape and nothing is written', async () => {
    const lotId = await lotOf(100);
    const res = await bank.grower.agent
      .post(`${base()}/lots/${lotId}/stock`)
      .set('Idempotency-Key', 'short key!')
      .send({ change: -3, reason: 'sown', date: '2026-03-19', kind: 'sown' });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({
      code: 'invalid_input',
      fields: { 'Idempotency-Key': expect.any(String) },
    });
    expect((await ledgerLines(lotId)).filter((l) => l.change === -3)).toEqual([]);
  });
});
