import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInThroughApi } from '../helpers/browser';
import { seriousViolations } from '../helpers/journey';
import { labelTexts, readLabelQr } from '../helpers/label-reading';
import { finishedAssay } from '../helpers/lots';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts; the lot and
// its note are invented for this file.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };
const NOTE = 'Only for the Thursday swap table, not the library shelf';

describe.skipIf(!chromiumPath)('a packet page anyone can open, in Chromium', () => {
  const suite = browserSuite({ now: '2026-03-14T09:00:00Z', demo: 'people' });
  let lot: { id: string; code: string };
  let api: ReturnType<typeof request.agent>;

  beforeAll(async () => {
    api = request.agent(suite.server.app);
    expect(
      (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    const species = await api.get(`/api/banks/${suite.bankId}/species`);
    const tomato = (species.body.items as { id: string; commonName: string }[]).find((s) =>
      /^tomato$/i.test(s.commonName),
    );
    const created = await api.post(`/api/banks/${suite.bankId}/lots`).send({
      speciesId: tomato!.id,
      variety: 'Gift Packet Gold',
      origin: 'saved',
      harvestDate: '2025-09-12',
      seedCount: 120,
      notes: NOTE,
    });
    expect(created.status).toBe(201);
    lot = created.body.lot;
    // 2 × 25 sown, 22 + 21 came up: 43 of 50, 86% (the pooled count over seeds sown, ISTA Rules, ch. 5).
    await finishedAssay(api, suite.bankId, lot.id, '2026-02-02', [
      { sown: 25, germinated: 22 },
      { sown: 25, germinated: 21 },
    ]);
  }, 60_000);

  it('when a grower turns the page on, then the label’s QR opens it on a phone without signing in, and turning it off closes it', async () => {
    const context = await suite.browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true });
    await signInThroughApi(context, suite.server.baseUrl, grower.email);
    const page = await context.newPage();
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lot.id}`);
    const card = page.getByRole('region', { name: 'Packet page' });
    await card.getByRole('button', { name: 'Turn on the packet page' }).tap();
    const field = card.getByRole('textbox', { name: 'Packet page address' });
    await expect.poll(() => field.inputValue()).toMatch(/\/p\/[\w-]{43}$/);
    const url = await field.inputValue();

    // The label the grower prints now carries the page in its QR code (read back with jsQR).
    const svg = await api.get(`/api/banks/${suite.bankId}/lots/${lot.id}/label.svg`).buffer(true);
    expect(await readLabelQr(svg.body.toString('utf8'))).toBe(url);
    const giving = await api
      .get(`/api/banks/${suite.bankId}/lots/${lot.id}/label.svg?for=giving`)
      .buffer(true);
    expect(labelTexts(giving.body.toString('utf8'))).toContain('germination 86%, tested Feb 2026');

    // Someone given the packet: a fresh browser with no cookie, on a phone.
    const stranger = await suite.browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true });
    const reader = await stranger.newPage();
    const scripts: string[] = [];
    const fonts: string[] = [];
    reader.on('request', (req) => {
      if (req.resourceType() === 'script') scripts.push(req.url());
      if (req.resourceType() === 'font') fonts.push(new URL(req.url()).origin);
    });
    const opened = await reader.goto(url);
    expect(opened?.status()).toBe(200);
    const text = await reader.locator('main').innerText();
    expect(text).toContain('Tomato');
    expect(text).toContain('Gift Packet Gold');
    expect(text).toContain('Harvested in 2025');
    expect(text).toContain('86% came up in the latest germination test, Feb 2026');
    expect(text).toContain('Poisonous: handle tomato seed with care');
    expect(text).not.toContain(NOTE);
    expect(text).not.toContain(lot.code);
    expect(text).not.toContain(grower.name);
    expect(await reader.locator('meta[name="robots"]').getAttribute('content')).toContain('noindex');
    // No app code, and the typeface from this server only.
    expect(scripts).toEqual([]);
    await reader.evaluate(() => document.fonts.ready);
    expect(await reader.evaluate(() => document.fonts.check("700 16px 'Source Sans 3'"))).toBe(true);
    expect(fonts.length).toBeGreaterThan(0);
    expect(new Set(fonts)).toEqual(new Set([suite.server.baseUrl]));
    // Readable on the phone: nothing wider than the screen.
    expect(await reader.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      PHONE.width,
    );
    expect(await seriousViolations(reader)).toEqual([]);

    // The grower turns it off: the address the packet carries answers 404 at once.
    await card.getByRole('button', { name: 'Turn off' }).tap();
    await page
      .getByRole('dialog', { name: 'Turn the packet page off?' })
      .getByRole('button', { name: 'Turn off' })
      .tap();
    await card.getByRole('button', { name: 'Turn on the packet page' }).waitFor();
    const closed = await reader.reload();
    expect(closed?.status()).toBe(404);
    expect(await reader.locator('main').innerText()).toContain('This packet page is not available');
    await stranger.close();
    await context.close();
  });

  it('when labels are printed for giving seed away, then the sheet says local labelling rules apply and draws the giving packets', async () => {
    const context = await suite.browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true });
    await signInThroughApi(context, suite.server.baseUrl, grower.email);
    const page = await context.newPage();
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/labels?lots=${lot.id}`);
    const image = page.getByRole('img', { name: new RegExp(`Label for lot ${lot.code}`) });
    await image.waitFor();
    expect(await image.getAttribute('src')).not.toContain('for=giving');
    expect(await page.getByRole('note').filter({ hasText: 'labelling rules' }).count()).toBe(0);
    // The choice lives in the address (as the paper does): the radio turns on once the page follows it.
    await page.getByRole('radio', { name: 'Giving seed away' }).click();
    await page.waitForURL(/for=giving/);
    await expect.poll(() => page.getByRole('radio', { name: 'Giving seed away' }).isChecked()).toBe(true);
    const caution = page
      .getByRole('note')
      .filter({ hasText: 'Giving seed away: local labelling rules apply' });
    await caution.waitFor();
    expect(await caution.innerText()).toMatch(/check what your local rules ask/);
    await expect.poll(() => image.getAttribute('src')).toContain('for=giving');
    // The picture loaded, so Print is offered again.
    await page.getByRole('button', { name: 'Print' }).waitFor();
    expect(await seriousViolations(page)).toEqual([]);
    await context.close();
  });
});
