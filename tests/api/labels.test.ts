import sharp from 'sharp';
import request, { type Agent } from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bankWithRoles } from '../helpers/accounts';
import { labelTexts as textsOf, readLabelQr as readQr } from '../helpers/label-reading';
import { createTestContext, type TestContext } from '../helpers/context';
import { finishedAssay, speciesId } from '../helpers/lots';

/** The label and its status; superagent hands an image/* body over as a Buffer. */
async function getLabel(agent: Agent | ReturnType<typeof request>, path: string) {
  const res = await agent.get(path).buffer(true);
  return {
    status: res.status,
    headers: res.headers,
    body: Buffer.isBuffer(res.body) ? res.body.toString('utf8') : '',
  };
}

describe('packet labels', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let lotId: string;
  let code: string;
  let labelPath: string;
  const variety = 'Black & White <Cherry> "Mia\'s"';

  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-03-01T09:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db);
    const tomato = await speciesId(ctx.db, 'tomato');
    const created = await bank.grower.agent
      .post(`/api/banks/${bank.bankId}/lots`)
      .send({ speciesId: tomato, variety, origin: 'saved', harvestDate: '2025-09-14', seedCount: 400 });
    expect(created.status).toBe(201);
    lotId = created.body.lot.id;
    code = created.body.lot.code;
    labelPath = `/api/banks/${bank.bankId}/lots/${lotId}/label.svg`;

    // The latest test by start date is recorded first, so creation order cannot pass for date order.
    // Four replicates of 25: 21 + 20 + 19 + 22 = 82 normal seedlings of 100 sown, 82% — the pooled
    // count over seeds sown, rounded to a whole percent (ISTA Rules, ch. 5).
    await finishedAssay(bank.grower.agent, bank.bankId, lotId, '2026-02-14', [
      { sown: 25, germinated: 21 },
      { sown: 25, germinated: 20 },
      { sown: 25, germinated: 19 },
      { sown: 25, germinated: 22 },
    ]);
    // An older test, 47 of 50 (94%), which the label must not show.
    await finishedAssay(bank.grower.agent, bank.bankId, lotId, '2025-10-01', [{ sown: 50, germinated: 47 }]);
    // A newer test that nobody has counted yet says nothing about the lot.
    const uncounted = await bank.grower.agent
      .post(`/api/banks/${bank.bankId}/lots/${lotId}/tests`)
      .send({ startDate: '2026-02-26', method: 'paper towel', trays: [{ seedsSown: 20 }] });
    expect(uncounted.status).toBe(201);
  });
  afterAll(() => ctx.close());

  it('when a viewer asks for a lot’s label, then it is an SVG of 70 × 35 mm whose QR code opens the lot page', async () => {
    const res = await getLabel(bank.viewer.agent, labelPath);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^image\/svg\+xml/);
    expect(res.headers['content-security-policy']).toBe(
      "default-src 'none'; style-src 'unsafe-inline'; font-src data:",
    );
    const svg = res.body as string;
    expect(svg).toMatch(/<svg [^>]*width="70mm" height="35mm" viewBox="0 0 70 35"/);
    expect(await readQr(svg)).toBe(`${ctx.config.appOrigin}/banks/${bank.bankId}/lots/${lotId}`);
  });

  it('when the variety holds & < > and quotes, then the label parses and shows code, variety, harvest and the latest test', async () => {
    const svg = (await getLabel(bank.viewer.agent, labelPath)).body as string;
    await expect(sharp(Buffer.from(svg)).metadata()).resolves.toMatchObject({ format: 'svg' });
    const text = textsOf(svg);
    expect(text).toContain(code);
    expect(text).toContain('Tomato');
    // The variety may break over two lines at a space.
    expect(text.replace(/\n/g, ' ')).toContain(variety);
    // Dates in words, as on every screen (shared/day-words.ts): never the ISO form on a packet.
    expect(text).toContain('harvested 14 Sep 2025');
    expect(text).toContain('last test: 82% on 14 Feb 2026');
    expect(text).not.toMatch(/\d{4}-\d{2}-\d{2}/);
    expect(text).not.toContain('94%');
  });

  it('when the latest counted test is still running, then the label gives its percent so far', async () => {
    const tomato = await speciesId(ctx.db, 'tomato');
    const lot = await bank.grower.agent
      .post(`/api/banks/${bank.bankId}/lots`)
      .send({ speciesId: tomato, variety: 'Early', origin: 'bought', packedForSeason: 2026, seedCount: 30 });
    const assay = await bank.grower.agent
      .post(`/api/banks/${bank.bankId}/lots/${lot.body.lot.id}/tests`)
      .send({ startDate: '2026-02-20', method: 'paper towel', trays: [{ seedsSown: 20 }] });
    // 9 of 20 sown: 45%.
    const counted = await bank.grower.agent
      .post(`/api/banks/${bank.bankId}/tests/${assay.body.test.id}/counts`)
      .send({ date: '2026-02-27', trays: [{ trayId: assay.body.trays[0].id, cumulative: 9 }] });
    expect(counted.status).toBe(201);
    const text = textsOf(
      (await getLabel(bank.viewer.agent, `/api/banks/${bank.bankId}/lots/${lot.body.lot.id}/label.svg`)).body,
    );
    expect(text).toContain('packed for 2026');
    expect(text).toContain('test from 20 Feb 2026: 45% so far');
  });

  it('when a lot has no test, then its label says so', async () => {
    const tomato = await speciesId(ctx.db, 'tomato');
    const lot = await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots`).send({
      speciesId: tomato,
      variety: 'Untested',
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount: 10,
    });
    const text = textsOf(
      (await getLabel(bank.viewer.agent, `/api/banks/${bank.bankId}/lots/${lot.body.lot.id}/label.svg`)).body,
    );
    expect(text).toContain('not tested yet');
  });

  it('when someone outside the bank asks, then it is 404', async () => {
    expect((await getLabel(bank.outsider.agent, labelPath)).status).toBe(404);
  });

  it('when someone signed out asks, then it is 401', async () => {
    expect((await getLabel(request(ctx.app), labelPath)).status).toBe(401);
  });

  it('when the lot is of another bank, then it is 404', async () => {
    const other = await bankWithRoles(ctx.app, ctx.db);
    const res = await getLabel(other.owner.agent, `/api/banks/${other.bankId}/lots/${lotId}/label.svg`);
    expect(res.status).toBe(404);
  });

  it('when the lot id is malformed, then it is 404', async () => {
    expect(
      (await getLabel(bank.viewer.agent, `/api/banks/${bank.bankId}/lots/not-a-lot/label.svg`)).status,
    ).toBe(404);
  });

  it('when the label route is mounted, then the lot’s other routes under /lots/:lotId still answer', async () => {
    expect((await bank.viewer.agent.get(`/api/banks/${bank.bankId}/lots/${lotId}`)).body.lot.code).toBe(code);
    expect((await bank.viewer.agent.get(`/api/banks/${bank.bankId}/lots/${lotId}/viability`)).status).toBe(
      200,
    );
  });
});
