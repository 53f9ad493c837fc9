import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, vi } from 'vitest';
import { createDemoSeason } from '#server/demo/demo-scenario';
import { DEMO_BANK_NAME, DEMO_PASSWORD, addDemoPeople } from '#server/demo/demo-people';
import { launchChromium, type TestBrowser } from './chromium';
import { createTestContext, type TestContext } from './context';

export const chromiumPath =
  process.env.HILUM_CHROMIUM ?? (fs.existsSync('/usr/bin/chromium') ? '/usr/bin/chromium' : '');

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

export type { TestBrowser };
export type TestServer = Awaited<ReturnType<typeof startTestServer>>;

/** Debian's chromium, headless, with a fresh profile and no background traffic. */
export function launchBrowser(): Promise<TestBrowser> {
  return launchChromium(chromiumPath);
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
  server.on('request', ctx.app);
  return {
    ...ctx,
    baseUrl,
    async stop() {
      server.closeAllConnections();
      await new Promise((r) => server.close(r));
      await ctx.close();
    },
  };
}

export interface BrowserSuite {
  /** The real app with the built client on a free loopback port. */
  readonly server: TestServer;
  readonly browser: TestBrowser;
  /** The demo bank's id; only with `demo: 'people'` or `'season'`. */
  readonly bankId: string;
}

/**
 * The setup every browser test file shares, as a beforeAll and an afterAll of the describe block it
 * is called in (call it first, so the block's own beforeAll runs after it): the real app on a free
 * port with its test clock at `now`; with `demo: 'people'` the demo people and bank
 * (server/demo/demo-people.ts), with `demo: 'season'` the whole demo season of lots and tests
 * (server/demo/demo-scenario.ts) as of `now`; and a headless Chromium. All of it is closed after the
 * block. `timeoutMs` is the beforeAll's timeout, for the longer set-ups.
 */
export function browserSuite(
  options: { now?: string; demo?: 'people' | 'season'; timeoutMs?: number } = {},
): BrowserSuite {
  let server: TestServer | undefined;
  let browser: TestBrowser | undefined;
  let bankId: string | undefined;
  beforeAll(async () => {
    server = await startTestServer(options.now ? { now: options.now } : {});
    if (options.demo === 'season') {
      const seeded = await createDemoSeason({
        db: server.db,
        storage: server.storage,
        mailer: server.mailer,
        clock: server.clock,
        appOrigin: server.baseUrl,
        hasher: server.hasher,
      });
      if (!seeded) throw new Error('the demo season was not seeded: its database already held lots');
      bankId = seeded.bankId;
    } else if (options.demo === 'people') {
      await addDemoPeople(server.db, server.hasher);
      bankId = (
        await server.db
          .selectFrom('banks')
          .select('id')
          .where('name', '=', DEMO_BANK_NAME)
          .executeTakeFirstOrThrow()
      ).id;
    }
    browser = await launchBrowser();
  }, options.timeoutMs);
  afterAll(async () => {
    await browser?.close();
    browser?.cleanup();
    await server?.stop();
  });
  const ready = <T>(value: T | undefined, what: string): T => {
    if (value === undefined)
      throw new Error(`the browser suite has no ${what}: its beforeAll did not run or failed`);
    return value;
  };
  return {
    get server() {
      return ready(server, 'server');
    },
    get browser() {
      return ready(browser, 'browser');
    },
    get bankId() {
      return ready(bankId, "bank (pass demo: 'people' or 'season')");
    },
  };
}

/**
 * Signs a browser context in through the API: the session cookie lands in the context, and no page
 * opens. For tests whose subject is another page, where going through the sign-in page would also
 * wait on the bank's overview (slow in a bank of thousands of lots).
 */
export async function signInThroughApi(
  context: BrowserContext,
  baseUrl: string,
  email: string,
  password = DEMO_PASSWORD,
) {
  const res = await context.request.post(`${baseUrl}/api/auth/login`, { data: { email, password } });
  if (res.status() !== 200) throw new Error(`sign-in failed: ${res.status()} ${await res.text()}`);
}

/** Signs in through the sign-in page, as a person would, and waits for the bank's overview to open. */
export async function signInAt(
  page: Page,
  baseUrl: string,
  email: string,
  bankId: string,
  password = DEMO_PASSWORD,
) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(`${baseUrl}/banks/${bankId}/overview`);
}
