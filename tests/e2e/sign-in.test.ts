// The sign-in form as a grower meets it: what it says when a field is missing or wrong, what the
// server says when the pair does not match, and that fixing a field clears its message. The
// messages are Hilum's own (shared/schemas/accounts.ts and the auth service); the people are the
// invented demo scenario of server/demo/demo-people.ts.
import { describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath } from '../helpers/browser';

const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;

describe.skipIf(!chromiumPath)('signing in, in Chromium', () => {
  const suite = browserSuite({ demo: 'people' });

  it('when the form is sent empty, then a wrong pair, then the right one, then each message fits the mistake and the grower gets in', async () => {
    const context = await suite.browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true });
    const page = await context.newPage();
    try {
      await page.goto(`${suite.server.baseUrl}/sign-in`);
      const email = page.getByLabel('E-mail');
      const password = page.getByLabel('Password', { exact: true });
      const send = page.getByRole('button', { name: 'Sign in' });

      // Nothing filled in: both fields say so, and the first one has the focus.
      await send.click();
      await page.getByText('Enter a valid e-mail address.').waitFor();
      expect(await page.getByText('Enter your password.').count()).toBe(1);
      expect(await email.evaluate((el) => el === document.activeElement)).toBe(true);
      expect(await email.getAttribute('aria-invalid')).toBe('true');

      // Typing an address clears its message; the password's stays until it is filled.
      await email.fill(grower.email);
      await expect.poll(() => page.getByText('Enter a valid e-mail address.').count()).toBe(0);
      expect(await page.getByText('Enter your password.').count()).toBe(1);

      // A wrong password: the server's answer for the whole form, and nobody is signed in.
      await password.fill('not-the-password');
      await send.click();
      await page.getByRole('alert').filter({ hasText: 'do not match an account' }).waitFor();
      expect(new URL(page.url()).pathname).toBe('/sign-in');

      await password.fill(DEMO_PASSWORD);
      await send.click();
      await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/overview`);
    } finally {
      await context.close();
    }
  });
});
