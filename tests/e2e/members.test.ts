import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_BANK_NAME } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { waitForMail } from '../helpers/outbox';

// The people and the bank below are the invented demo scenario of server/demo/demo-people.ts.
const owner = DEMO_ACCOUNTS.find((a) => a.role === 'owner')!;
const viewer = DEMO_ACCOUNTS.find((a) => a.role === 'viewer')!;

// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };

describe.skipIf(!chromiumPath)('the members page in Chromium', () => {
  const suite = browserSuite({ demo: 'people' });

  const signIn = (page: Page, email: string) => signInAt(page, suite.server.baseUrl, email, suite.bankId);

  async function openMembers(page: Page) {
    await page.getByRole('link', { name: 'Members' }).click();
    await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/members`);
    await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe('Members');
  }

  it('when the owner signs in and invites someone as a grower, then the invitation is listed as open and mailed', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, owner.email);
    await openMembers(page);

    const invitee = 'new-member@example.org';
    await page.getByLabel('Their e-mail').fill(invitee);
    await page.getByRole('radio', { name: /^Grower/ }).check();
    await page.getByRole('button', { name: 'Send invitation' }).click();

    await expect
      .poll(() => page.getByRole('status').filter({ hasText: 'Invitation sent' }).innerText())
      .toContain(invitee);
    const open = page.getByRole('list', { name: 'Open invitations' }).getByRole('listitem');
    await expect.poll(() => open.filter({ hasText: invitee }).count()).toBe(1);
    await expect.poll(() => open.filter({ hasText: invitee }).innerText()).toMatch(/Grower/);
    await expect.poll(() => open.filter({ hasText: invitee }).innerText()).toContain(`Sent by ${owner.name}`);

    // The page did not just draw it: the server holds the invitation and sent the e-mail.
    const row = await suite.server.db
      .selectFrom('invitations')
      .select(['role', 'accepted_at', 'revoked_at'])
      .where('email', '=', invitee)
      .executeTakeFirstOrThrow();
    expect(row).toEqual({ role: 'grower', accepted_at: null, revoked_at: null });
    const mail = await waitForMail((m) => m.to.includes(invitee));
    expect(mail.text).toContain(`${suite.server.baseUrl}/invitations/accept?token=`);
    // The list follows the mail from the queue: waiting, then sent.
    await expect.poll(() => open.filter({ hasText: invitee }).innerText()).toMatch(/\bSent\b/);

    // Sent again: a second mail with a new link, and the first link no longer works.
    await page.getByRole('button', { name: `Send the invitation to ${invitee} again` }).click();
    const second = await waitForMail((m) => m.to.includes(invitee) && m.id !== mail.id);
    const tokenOf = (text: string) => /invitations\/accept\?token=(\S+)/.exec(text)?.[1];
    expect(tokenOf(second.text)).toBeTruthy();
    expect(tokenOf(second.text)).not.toBe(tokenOf(mail.text));
    await expect.poll(() => open.filter({ hasText: invitee }).innerText()).toMatch(/\bSent\b/);
    await page.close();
  });

  it('when someone signs up, then the account menu says the address is unconfirmed until the mailed link is used', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    const email = `confirm-${Date.now()}@example.org`;
    await page.goto(`${suite.server.baseUrl}/sign-up`);
    await page.getByLabel('Your name').fill('Newcomer');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password', { exact: true }).fill('a long enough password');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.waitForURL((url) => !url.pathname.startsWith('/sign-up'));

    await page.getByRole('button', { name: 'Account', exact: true }).click();
    await expect.poll(() => page.getByText('Address not confirmed yet').first().isVisible()).toBe(true);
    const first = await waitForMail((m) => m.to.includes(email) && /confirm/i.test(m.subject));
    await page.getByRole('button', { name: 'Send the link again' }).click();
    await expect
      .poll(() => page.getByRole('status').filter({ hasText: 'A new link is on its way' }).count())
      .toBe(1);
    const second = await waitForMail(
      (m) => m.to.includes(email) && /confirm/i.test(m.subject) && m.id !== first.id,
    );

    const link = /\S+\/verify-email\?token=\S+/.exec(second.text)![0];
    await page.goto(link);
    await page.getByRole('button', { name: 'Confirm my e-mail address' }).click();
    await expect
      .poll(() => page.getByRole('status').filter({ hasText: 'Address confirmed' }).count())
      .toBe(1);
    await page.goto(`${suite.server.baseUrl}/`);
    await page.getByRole('button', { name: 'Account', exact: true }).click();
    await expect.poll(() => page.getByText('Address confirmed', { exact: true }).isVisible()).toBe(true);
    expect(await page.getByText('Address not confirmed yet').count()).toBe(0);
    await page.close();
  });

  it('when a viewer opens Members, then every member is listed with a role and nothing can be changed', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, viewer.email);
    await openMembers(page);

    const members = page.getByRole('list', { name: 'Members of this bank' }).getByRole('listitem');
    await expect.poll(() => members.count()).toBe(DEMO_ACCOUNTS.length);
    for (const account of DEMO_ACCOUNTS) {
      const item = members.filter({ hasText: account.email });
      await expect.poll(() => item.innerText()).toContain(account.name);
      await expect.poll(() => item.innerText()).toMatch(new RegExp(account.role, 'i'));
    }
    expect(await page.getByLabel('Their e-mail').count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Send invitation' }).count()).toBe(0);
    expect(await page.getByRole('combobox').count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Remove/ }).count()).toBe(0);
    expect(await page.getByRole('list', { name: 'Open invitations' }).count()).toBe(0);
    // Leaving is the one thing every member may do.
    expect(await page.getByRole('button', { name: `Leave ${DEMO_BANK_NAME}` }).count()).toBe(1);
    await page.close();
  });

  it('when a phone opens sign-in and then Members, then neither page scrolls sideways', async () => {
    const context = await suite.browser.newContext({ viewport: PHONE, hasTouch: true });
    const page = await context.newPage();
    await page.goto(`${suite.server.baseUrl}/sign-in`);
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width);

    await signIn(page, owner.email);
    await openMembers(page);
    await page.getByRole('list', { name: 'Members of this bank' }).waitFor();
    await page.getByRole('button', { name: 'Send invitation' }).waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width);
    await context.close();
  });
  it('when someone starts a new bank from a browser in another time zone, then the bank keeps that zone for its calendar', async () => {
    // America/Winnipeg: a zone of the IANA time zone database, six hours behind UTC in winter.
    const context = await suite.browser.newContext({
      viewport: { width: 1280, height: 900 },
      timezoneId: 'America/Winnipeg',
    });
    const page = await context.newPage();
    await signIn(page, viewer.email);
    await page.goto(`${suite.server.baseUrl}/banks/new`);
    await page.getByLabel('Name of the bank').fill('Porch Shelf Seeds');
    await page.getByRole('button', { name: 'Start the bank' }).click();
    await page.waitForURL(/\/banks\/[0-9a-f-]{36}\/overview/);
    const created = await suite.server.db
      .selectFrom('banks')
      .select('time_zone')
      .where('name', '=', 'Porch Shelf Seeds')
      .executeTakeFirstOrThrow();
    expect(created.time_zone).toBe('America/Winnipeg');
    await context.close();
  });
});
