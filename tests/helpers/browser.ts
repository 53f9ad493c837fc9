import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { vi } from 'vitest';
import { createApp } from '../../server/app';
import { DEMO_PASSWORD } from '../../server/db/seed-demo';
import { createTestContext, type TestContext } from './context';

export const chromiumPath = process.env.HILUM_CHROMIUM ?? (fs.existsSync('/usr/bin/chromium') ? '/usr/bin/chromium' : '');

if (!chromiumPath) {
  console.warn('\n!!! chromium not found: BROWSER TESTS ARE SKIPPED (apt-get install chromium) !!!\n');
}

/**
 * How long a browser test's `expect.poll` waits for its condition, unless the call says otherwise.
 * Vitest's own default is 1 s: on a busy 2-core machine a page often takes longer than that to fetch
 * and draw, and the test failed although the page was right. A condition that holds returns at once,
 * so the longer wait costs nothing unless the test fails. Set for the files that import this module
 * (the browser tests) only.
 */
export const POLL_TIMEOUT_MS = 20_000;
vi.setConfig({ expect: { poll: { timeout: POLL_TIMEOUT_MS } } });

/** Debian's chromium, headless, with a fresh profile and no background traffic. */
export async function launchBrowser(): Promise<Browser & { cleanup(): void }> {
  const home = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-chromium-'));
  const browser = await chromium.launch({
    executablePath: chromiumPath,
    headless: true,
    env: { ...process.env, HOME: home },
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
      '--disable-quic',
      `--user-data-dir=${path.join(home, 'profile')}`,
    ].filter((a) => !a.startsWith('--user-data-dir')),
  });
  return Object.assign(browser, { cleanup: () => fs.rmSync(home, { recursive: true, force: true }) });
}

/** The real app with the built client, listening on a free loopback port. */
export async function startTestServer(
  options: Parameters<typeof createTestContext>[0] = {},
): Promise<TestContext & { baseUrl: string; stop(): Promise<void> }> {
  const server = http.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  const baseUrl = `http://127.0.0.1:${port}`;
  const ctx = await createTestContext({ ...options, config: { ...options.config, appOrigin: baseUrl } });
  const app = createApp({ config: ctx.config, db: ctx.db, storage: ctx.storage, mailer: ctx.mailer, clock: ctx.clock });
  server.on('request', app);
  return {
    ...ctx,
    app,
    baseUrl,
    async stop() {
      server.closeAllConnections();
      await new Promise((r) => server.close(r));
      await ctx.close();
    },
  };
}

/**
 * Signs a browser context in through the API: the session cookie lands in the context, and no page
 * opens. For tests whose subject is another page, where going through the sign-in page would also
 * wait on the bank's overview (slow in a bank of thousands of lots).
 */
export async function signInThroughApi(context: BrowserContext, baseUrl: string, email: string, password = DEMO_PASSWORD) {
  const res = await context.request.post(`${baseUrl}/api/auth/login`, { data: { email, password } });
  if (res.status() !== 200) throw new Error(`sign-in failed: ${res.status()} ${await res.text()}`);
}

/** Signs in through the sign-in page, as a person would, and waits for the bank's overview to open. */
export async function signInAt(page: Page, baseUrl: string, email: string, bankId: string, password = DEMO_PASSWORD) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(`${baseUrl}/banks/${bankId}/overview`);
}
