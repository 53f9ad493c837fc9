import { describe, expect, it } from 'vitest';
import { browserSuite, chromiumPath } from '../helpers/browser';

describe.skipIf(!chromiumPath)('the built app in Chromium', () => {
  const suite = browserSuite();

  it('when the home page loads, then it is set in Source Sans 3 and no request leaves 127.0.0.1', async () => {
    const page = await suite.browser.newPage();
    const hosts = new Set<string>();
    page.on('request', (req) => hosts.add(new URL(req.url()).hostname));
    await page.goto(suite.server.baseUrl, { waitUntil: 'networkidle' });
    await page.evaluate(() => document.fonts.ready);

    const family = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
    expect(family).toMatch(/^"?Source Sans 3"?/);
    const loaded = await page.evaluate(() =>
      [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family.replace(/"/g, '')),
    );
    expect(loaded).toContain('Source Sans 3');
    expect([...hosts].filter((h) => h !== '127.0.0.1')).toEqual([]);
    await page.close();
  });

  it('when an unknown path is opened, then the not-found page shows', async () => {
    const page = await suite.browser.newPage();
    await page.goto(`${suite.server.baseUrl}/no/such/page`);
    await expect.poll(() => page.locator('body').innerText()).toMatch(/not found|no page|nothing here/i);
    await page.close();
  });
});
