import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { redactUrl } from '#server/http/request-log';
import { bankWithRoles } from '../helpers/accounts';
import { labelTexts, readLabelQr } from '../helpers/label-reading';
import { createTestContext, type TestContext } from '../helpers/context';
import { finishedAssay, speciesId } from '../helpers/lots';

// Every name, place and note below is invented for this file.
const NAMES = { owner: 'Orla Thistlewood', grower: 'Bram Quillfeather', viewer: 'Ines Marrowby' };
const NOTES = 'Kept behind the blue crate; swap only with the Wednesday group';
const STORAGE_PLACE = 'Pantry tin number seven';
const PLANT_LABEL = 'Stake 14 by the rain barrel';
const VARIETY = 'Black & White <Cherry> "Mia\'s"';

/** The page's visible text: tags dropped, the five entities decoded, white space folded. */
function visibleText(html: string): string {
  return html
    .replace(/<style[\s\S]*?<\/style>/g, ' ')
    .replace(/<[^>]+>/g, ' ')
    .replace(
      /&(amp|lt|gt|quot|apos);/g,
      (_m, e: string) => ({ amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" })[e]!,
    )
    .replace(/\s+/g, ' ');
}

describe('the public packet page', () => {
  let ctx: TestContext;
  let bank: Awaited<ReturnType<typeof bankWithRoles>>;
  let lot: { id: string; code: string };
  let pagePath: string;
  let labelPath: string;
  let firstUrl: string;

  beforeAll(async () => {
    ctx = await createTestContext({ now: '2026-03-01T09:00:00Z' });
    bank = await bankWithRoles(ctx.app, ctx.db);
    for (const role of ['owner', 'grower', 'viewer'] as const)
      await ctx.db
        .updateTable('users')
        .set({ name: NAMES[role] })
        .where('id', '=', bank[role].user.id)
        .execute();
    await ctx.changeFeed.sync();

    const tomato = await speciesId(ctx.db, 'tomato');
    const plant = await bank.grower.agent.post(`/api/banks/${bank.bankId}/plants`).send({
      speciesId: tomato,
      label: PLANT_LABEL,
      variety: 'Black & White Cherry',
      season: 2025,
      hybrid: true,
    });
    expect(plant.status).toBe(201);
    const created = await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots`).send({
      speciesId: tomato,
      variety: VARIETY,
      origin: 'saved',
      harvestDate: '2025-09-14',
      seedCount: 437,
      treated: true,
      notes: NOTES,
      storage: { place: 'room', location: STORAGE_PLACE },
      parentPlantIds: [plant.body.plant.id],
    });
    expect(created.status).toBe(201);
    lot = created.body.lot;
    pagePath = `/api/banks/${bank.bankId}/lots/${lot.id}/packet-page`;
    labelPath = `/api/banks/${bank.bankId}/lots/${lot.id}/label.svg`;
    // Four replicates of 25: 21 + 20 + 19 + 22 = 82 normal seedlings of 100 sown, 82% — the pooled
    // count over seeds sown, rounded to a whole percent (ISTA Rules, ch. 5).
    await finishedAssay(bank.grower.agent, bank.bankId, lot.id, '2026-02-14', [
      { sown: 25, germinated: 21 },
      { sown: 25, germinated: 20 },
      { sown: 25, germinated: 19 },
      { sown: 25, germinated: 22 },
    ]);
  });
  afterAll(() => ctx.close());

  it('when a viewer tries to turn the page on or off, then it is 403, and someone outside the bank gets 404', async () => {
    expect((await bank.viewer.agent.post(pagePath)).status).toBe(403);
    expect((await bank.viewer.agent.delete(pagePath)).status).toBe(403);
    expect((await bank.outsider.agent.post(pagePath)).status).toBe(404);
    expect((await request(ctx.app).post(pagePath)).status).toBe(401);
    const state = await bank.viewer.agent.get(pagePath);
    expect(state.status).toBe(200);
    expect(state.body).toEqual({ url: null });
  });

  it('when the input is bad, then it is a 4xx in the error shape', async () => {
    const withBody = await bank.grower.agent.post(pagePath).send({ public: 'yes' });
    expect(withBody.status).toBe(400);
    expect(withBody.body.error).toMatchObject({ code: 'invalid_input' });
    expect(Object.keys(withBody.body.error.fields ?? {})).not.toHaveLength(0);
    const malformed = await bank.grower.agent.post(`/api/banks/${bank.bankId}/lots/not-a-lot/packet-page`);
    expect(malformed.status).toBe(404);
    expect(malformed.body.error.code).toBe('not_found');
    const other = await bankWithRoles(ctx.app, ctx.db);
    const foreign = await other.owner.agent.post(`/api/banks/${other.bankId}/lots/${lot.id}/packet-page`);
    expect(foreign.status).toBe(404);
    const label = await bank.viewer.agent.get(`${labelPath}?for=everyone`);
    expect(label.status).toBe(400);
    expect(label.body.error.fields).toHaveProperty('for');
  });

  it('when a grower turns it on, then anyone opens it without signing in and it shows no private field', async () => {
    const on = await bank.grower.agent.post(pagePath);
    expect(on.status).toBe(201);
    firstUrl = on.body.url;
    // 32 random bytes under HMAC-SHA256, base64url: 43 characters (RFC 4648 §5, no padding).
    expect(firstUrl).toMatch(new RegExp(`^${ctx.config.appOrigin}/p/[A-Za-z0-9_-]{43}$`));
    expect((await bank.viewer.agent.get(pagePath)).body).toEqual({ url: firstUrl });
    // Only the token's hash is stored, never the token.
    const stored = await ctx.db.selectFrom('packet_pages').selectAll().execute();
    const token = firstUrl.split('/p/')[1]!;
    expect(JSON.stringify(stored)).not.toContain(token);

    const res = await request(ctx.app).get(new URL(firstUrl).pathname);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/html/);
    expect(res.headers['x-robots-tag']).toMatch(/noindex/);
    expect(res.headers['content-security-policy']).toMatch(/script-src|default-src 'none'/);
    expect(res.headers['set-cookie']).toBeUndefined();
    const html = res.text;
    expect(html).toContain('<meta name="robots" content="noindex, nofollow">');
    expect(html).toContain('name="viewport"');
    expect(html).not.toMatch(/<script/i);
    const text = visibleText(html);
    expect(text).toContain('Tomato');
    expect(text).toContain(VARIETY);
    expect(text).toContain('Solanum lycopersicum');
    expect(text).toContain('Harvested in 2025');
    // The latest test: 82% (above), dated by month and year in words.
    expect(text).toContain('82% came up in the latest germination test, Feb 2026');
    // Sowing: the species' reference traits (shared/species-reference.ts, tomato: indoors 6–8 weeks
    // before the last frost, seed covered, from the extension sources named there).
    expect(text).toContain('Start indoors, 6–8 weeks before the last spring frost.');
    expect(text).toContain('Needs dark: cover the seed.');
    // 70–75 °F in the reference (shared/species-reference.ts), 21.1–23.9 °C, said in whole degrees.
    expect(text).toContain('Keep it at 21–24 °C to germinate.');
    expect(text).toMatch(/Expected to come up on 1 Mar 2026: \d+% \(likely \d+%–\d+%\)/);
    // Cautions: treated seed, the species' poison caution, a hybrid parent, seed crossing borders.
    expect(text).toContain('Treated seed: handle with care');
    expect(text).toContain('Poisonous: handle tomato seed with care');
    expect(text).toContain('glycoalkaloids');
    expect(text).toContain('Saved from a hybrid plant');
    expect(text).toContain('Swapping across regions or borders');
    // Nothing private: no notes, member names or e-mails, stock, storage, plant labels, code or ids.
    for (const secret of [
      NOTES,
      ...Object.values(NAMES),
      bank.owner.user.email,
      bank.grower.user.email,
      STORAGE_PLACE,
      PLANT_LABEL,
      '437',
      lot.code,
      lot.id,
      bank.bankId,
      'Test circle',
    ])
      expect(html, secret).not.toContain(secret);
  });

  it('when a member scans a label holding the packet page, then the app finds the lot; anyone else gets 404', async () => {
    const token = firstUrl.split('/p/')[1]!;
    const found = await bank.viewer.agent.get(`/api/packet-pages/${token}`);
    expect(found.status).toBe(200);
    expect(found.body).toEqual({ bankId: bank.bankId, lotId: lot.id });
    expect((await bank.outsider.agent.get(`/api/packet-pages/${token}`)).status).toBe(404);
    expect((await request(ctx.app).get(`/api/packet-pages/${token}`)).status).toBe(401);
    const bad = await bank.viewer.agent.get('/api/packet-pages/not-a-token');
    expect(bad.status).toBe(404);
    expect(bad.body.error.code).toBe('not_found');
  });

  it('when the page is on, then the lot’s label QR opens it; the giving packet has germination and test month', async () => {
    const svg = (await bank.viewer.agent.get(labelPath).buffer(true)).body.toString('utf8');
    expect(await readLabelQr(svg)).toBe(firstUrl);
    const giving = (await bank.viewer.agent.get(`${labelPath}?for=giving`).buffer(true)).body.toString(
      'utf8',
    );
    expect(labelTexts(giving)).toContain('germination 82%, tested Feb 2026');
    expect(labelTexts(svg)).toContain('last test: 82% on 14 Feb 2026');
    expect(await readLabelQr(giving)).toBe(firstUrl);
  });

  it('when the page is turned on again, then the old address is 404 and the new one opens', async () => {
    const again = await bank.grower.agent.post(pagePath);
    expect(again.status).toBe(201);
    expect(again.body.url).not.toBe(firstUrl);
    const old = await request(ctx.app).get(new URL(firstUrl).pathname);
    expect(old.status).toBe(404);
    expect(old.headers['content-type']).toMatch(/^text\/html/);
    expect(old.text).toContain('This packet page is not available');
    expect((await request(ctx.app).get(new URL(again.body.url).pathname)).status).toBe(200);
    firstUrl = again.body.url;
  });

  it('when the page is turned off, then its address is 404 and the label opens the lot in the app again', async () => {
    expect((await bank.grower.agent.delete(pagePath)).status).toBe(204);
    expect((await request(ctx.app).get(new URL(firstUrl).pathname)).status).toBe(404);
    expect((await bank.viewer.agent.get(pagePath)).body).toEqual({ url: null });
    const svg = (await bank.viewer.agent.get(labelPath).buffer(true)).body.toString('utf8');
    expect(await readLabelQr(svg)).toBe(`${ctx.config.appOrigin}/banks/${bank.bankId}/lots/${lot.id}`);
    // Turning off a page already off is no error.
    expect((await bank.grower.agent.delete(pagePath)).status).toBe(204);
  });

  it('when an address is made up or malformed, then it is 404', async () => {
    for (const path of ['/p/short', `/p/${'A'.repeat(43)}`, `/p/${'x'.repeat(500)}`, '/p/%E0%A4%A'])
      expect((await request(ctx.app).get(path)).status, path).toBeLessThan(500);
    expect((await request(ctx.app).get(`/p/${'A'.repeat(43)}`)).status).toBe(404);
    expect((await request(ctx.app).get('/p/short')).status).toBe(404);
  });

  it('when the page asks for its font, then this server sends Source Sans 3 itself', async () => {
    const html = (await request(ctx.app).get('/p/gone')).text;
    const fonts = [...html.matchAll(/url\((\/[^)]+\.woff2)\)/g)].map((m) => m[1]!);
    expect(fonts).toHaveLength(2);
    for (const font of fonts) {
      const res = await request(ctx.app).get(font).buffer(true);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('font/woff2');
      // A WOFF2 file begins with the signature "wOF2" (W3C WOFF 2.0, §3).
      expect(
        Buffer.from(res.body as Buffer)
          .subarray(0, 4)
          .toString('latin1'),
      ).toBe('wOF2');
    }
  });

  it('when a request to a packet page is logged, then its token is not', () => {
    expect(redactUrl(`/p/${'A'.repeat(43)}`)).toBe('/p/[redacted]');
    expect(redactUrl(`https://hilum.example.org/p/${'A'.repeat(43)}?x=1`)).toBe(
      'https://hilum.example.org/p/[redacted]?x=1',
    );
  });
});
