import type { BrowserContext, Page } from 'playwright-core';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { enterCounts } from '../helpers/count-entry';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts; the lot and
// its test are invented for this file. Chromium's own offline emulation (context.setOffline) stands
// for the shed without a signal.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };

describe.skipIf(!chromiumPath)('the installable app offline at the bench, in Chromium', () => {
  const suite = browserSuite({ now: '2026-03-14T09:00:00Z', demo: 'people' });
  let assayId: string;
  let trayIds: string[];
  let growerId: string;
  let context: BrowserContext;
  let page: Page;

  beforeAll(async () => {
    const api = request.agent(suite.server.app);
    const login = await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD });
    expect(login.status).toBe(200);
    growerId = login.body.user.id;
    const species = await api.get(`/api/banks/${suite.bankId}/species`);
    const tomato = (species.body.items as { id: string; commonName: string }[]).find((s) =>
      /^tomato$/i.test(s.commonName),
    );
    const lot = await api.post(`/api/banks/${suite.bankId}/lots`).send({
      speciesId: tomato!.id,
      variety: 'Shed Bench Yellow',
      origin: 'saved',
      harvestDate: '2025-09-12',
      seedCount: 200,
    });
    expect(lot.status).toBe(201);
    const assay = await api.post(`/api/banks/${suite.bankId}/lots/${lot.body.lot.id}/tests`).send({
      startDate: '2026-03-08',
      method: 'paper towel',
      temperatureC: 24,
      trays: [{ seedsSown: 50 }, { seedsSown: 50 }],
    });
    expect(assay.status).toBe(201);
    assayId = assay.body.test.id;
    trayIds = (assay.body.trays as { id: string }[]).map((t) => t.id);

    context = await suite.browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true });
    page = await context.newPage();
  }, 60_000);
  afterAll(() => context?.close());

  const testPage = () => `${suite.server.baseUrl}/banks/${suite.bankId}/tests/${assayId}`;
  const trayName = (n: number) => `Tray ${n} · 50 sown`;
  const savedCounts = () =>
    suite.server.db
      .selectFrom('tray_counts')
      .select(['tray_id', 'cumulative'])
      .where('tray_id', 'in', trayIds)
      .where('check_date', '=', '2026-03-14')
      .execute();
  const waiting = () => page.locator('main [data-queued-writes] [data-waiting]');

  it('when the app is opened, then its manifest is linked, served as a manifest, and its icons load', async () => {
    await page.goto(`${suite.server.baseUrl}/sign-in`);
    const href = await page.locator('link[rel="manifest"]').getAttribute('href');
    expect(href).toBe('/manifest.webmanifest');
    const answer = await page.request.get(`${suite.server.baseUrl}${href}`);
    expect(answer.status()).toBe(200);
    // The W3C Web App Manifest spec's media type.
    expect(answer.headers()['content-type']).toMatch(/^application\/manifest\+json/);
    const manifest = (await answer.json()) as {
      name: string;
      start_url: string;
      display: string;
      theme_color: string;
      icons: { src: string; sizes: string; type: string; purpose?: string }[];
    };
    expect(manifest).toMatchObject({ short_name: 'Hilum', start_url: '/', display: 'standalone' });
    // The theme colour is the page's own (index.html's theme-color meta).
    expect(manifest.theme_color).toBe(await page.locator('meta[name="theme-color"]').getAttribute('content'));
    // Installable in Chromium: 192 and 512 px icons, one of them maskable (web.dev's install criteria, from memory).
    expect(manifest.icons.map((i) => i.sizes)).toEqual(expect.arrayContaining(['192x192', '512x512']));
    expect(manifest.icons.some((i) => i.purpose === 'maskable')).toBe(true);
    for (const icon of manifest.icons) {
      // Each icon drawn at its stated size, as the browser decodes it.
      const size = await page.evaluate(async (src) => {
        const image = new Image();
        image.src = src;
        await image.decode();
        return `${image.naturalWidth}x${image.naturalHeight}`;
      }, icon.src);
      expect(size).toBe(icon.sizes);
    }
  });

  it('when counts are saved with no network, then they wait, survive a reload, and are sent once when it returns', async () => {
    const countPosts: string[] = [];
    page.on('requestfinished', (req) => {
      if (req.method() === 'POST' && req.url().endsWith(`/tests/${assayId}/counts`))
        countPosts.push(req.url());
    });
    await signInAt(page, suite.server.baseUrl, grower.email, suite.bankId);
    // The service worker takes the page over; the test page is then visited once with the network.
    await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null)).toBe(true);
    await page.goto(testPage());
    await page.getByRole('button', { name: /^Save counts for/ }).waitFor();

    await context.setOffline(true);
    // The emulation reaches the service worker's own fetches too: a read never made before fails.
    const unseen = await page.evaluate(async (url) => {
      try {
        return (await fetch(url, { headers: { Accept: 'application/json' } })).status;
      } catch {
        return 'no network';
      }
    }, `/api/banks/${suite.bankId}/ranking?on=2026-03-01`);
    expect(unseen).toBe('no network');

    await enterCounts(page, '2026-03-14', [12, 9], trayName);
    await page.getByRole('button', { name: 'Save counts for Sat 14 Mar' }).tap();
    await expect.poll(() => waiting().count()).toBe(1);
    expect(await waiting().innerText()).toContain('Waiting to send: counts of Sat 14 Mar');
    // The top bar says so too (its words are for screen readers on a phone's narrow bar).
    await expect
      .poll(() => page.locator('[data-write-queue]').getByRole('status').textContent())
      .toContain('1 waiting to send');
    expect(await savedCounts()).toEqual([]);

    // Reloaded with no network: the page opens from what was kept, the counts still waiting.
    await page.reload();
    await page.getByRole('button', { name: /^Save counts for/ }).waitFor();
    await expect.poll(() => waiting().count()).toBe(1);
    expect(await page.getByRole('textbox', { name: trayName(1) }).inputValue()).toBe('12');
    expect(await page.getByRole('textbox', { name: trayName(2) }).inputValue()).toBe('9');
    expect(await savedCounts()).toEqual([]);
    expect(countPosts).toEqual([]);

    // The network returns: the queue sends by itself, once.
    await context.setOffline(false);
    await expect.poll(() => savedCounts().then((rows) => rows.length)).toBe(2);
    await expect.poll(() => waiting().count()).toBe(0);
    const rows = await savedCounts();
    expect(trayIds.map((id) => rows.find((r) => r.tray_id === id)?.cumulative)).toEqual([12, 9]);
    expect(countPosts).toHaveLength(1);
    const keys = await suite.server.db
      .selectFrom('idempotency_keys')
      .select(['status'])
      .where('user_id', '=', growerId)
      .execute();
    expect(keys).toEqual([{ status: 201 }]);
    // The page shows the server's figures: 21 of 100 sown.
    await expect.poll(() => page.locator('main').innerText()).toContain('21%');
    await expect.poll(() => page.locator('[data-write-queue]').count()).toBe(0);
  });

  it('when the grower signs out with a count still waiting, then it is deleted and the kept answers with it', async () => {
    // A count that cannot go (the server unreachable for it), waiting while the network is up.
    const countsUrl = `**/api/banks/${suite.bankId}/tests/${assayId}/counts`;
    await page.route(countsUrl, (route) => route.abort('internetdisconnected'));
    await page.goto(testPage());
    await enterCounts(page, '2026-03-13', [8, 7], trayName);
    await page.getByRole('button', { name: 'Save counts for Fri 13 Mar' }).tap();
    await expect.poll(() => waiting().count()).toBe(1);
    expect(await page.evaluate(() => caches.has('hilum-api'))).toBe(true);

    page.once('dialog', (dialog) => void dialog.accept());
    await page.getByRole('button', { name: 'Account' }).tap();
    await page.getByRole('button', { name: 'Sign out', exact: true }).tap();
    await page.waitForURL(`${suite.server.baseUrl}/sign-in`);
    await page.unroute(countsUrl);
    expect(await page.evaluate(() => caches.has('hilum-api'))).toBe(false);
    const left = await page.evaluate(
      () =>
        new Promise<number>((resolve, reject) => {
          const open = indexedDB.open('hilum-offline');
          open.onerror = () => reject(open.error);
          open.onsuccess = () => {
            const count = open.result.transaction('writes').objectStore('writes').count();
            count.onsuccess = () => resolve(count.result);
          };
        }),
    );
    expect(left).toBe(0);
    const keys = Object.keys(await page.evaluate(() => ({ ...localStorage })));
    expect(keys.filter((k) => k.startsWith('hilum.'))).toEqual([]);
    const rows = await suite.server.db
      .selectFrom('tray_counts')
      .select('cumulative')
      .where('tray_id', 'in', trayIds)
      .where('check_date', '=', '2026-03-13')
      .execute();
    expect(rows).toEqual([]);
  });
});
