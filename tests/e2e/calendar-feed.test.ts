import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInThroughApi } from '../helpers/browser';
import { seriousViolations } from '../helpers/journey';

const viewer = DEMO_ACCOUNTS.find((a) => a.role === 'viewer')!;
// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };

describe.skipIf(!chromiumPath)('subscribing to the calendar in Chromium', () => {
  const suite = browserSuite({ now: '2026-12-01T09:00:00Z', demo: 'people' });

  it('when a viewer follows the planner to the calendar link, copies it and makes a new one, then the old link stops and the new one answers', async () => {
    const context = await suite.browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
    await context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: suite.server.baseUrl });
    await signInThroughApi(context, suite.server.baseUrl, viewer.email);
    const page = await context.newPage();
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/planner`);
    // The one-off download stays beside the subscription.
    await page.getByRole('link', { name: 'Add to my calendar' }).waitFor();
    await page.getByRole('link', { name: 'Subscribe in your calendar app' }).click();
    await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/reminders#calendar`);

    const field = page.getByLabel('Your calendar link');
    await expect.poll(() => field.inputValue()).toMatch(/\/api\/calendar\/[\w-]{43}\.ics$/);
    const first = await field.inputValue();
    const path = (url: string) => new URL(url).pathname;
    const feed = await request(suite.server.app).get(path(first));
    expect(feed.status).toBe(200);
    expect(feed.text).toContain('BEGIN:VCALENDAR');

    await page.getByRole('button', { name: 'Copy link' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Copied' }).count()).toBe(1);
    expect(await page.evaluate(() => navigator.clipboard.readText())).toBe(first);

    await page.getByRole('button', { name: 'Make a new link' }).click();
    const dialog = page.getByRole('dialog', { name: 'Make a new calendar link?' });
    expect(await dialog.innerText()).toContain('The old link stops working');
    expect(await seriousViolations(page)).toEqual([]);
    await dialog.getByRole('button', { name: 'Make a new link' }).click();
    await expect.poll(() => field.inputValue()).not.toBe(first);
    const second = await field.inputValue();
    expect((await request(suite.server.app).get(path(first))).status).toBe(404);
    expect((await request(suite.server.app).get(path(second))).status).toBe(200);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width);
    await context.close();
  });
});
