// Debian's chromium for the browser tests and the cold-load bench: one launch, free of Vitest so a
// plain script (scripts/bench-cold-load.ts) can use it too.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type Browser } from 'playwright-core';

export type TestBrowser = Browser & { cleanup(): void };

/**
 * Debian's chromium, headless, with HOME in a fresh temporary folder and no background traffic
 * (this machine's closed network refuses it). Playwright gives each launch a fresh profile of its
 * own. `cleanup()` removes the temporary HOME after `close()`.
 */
export async function launchChromium(
  executablePath: string,
  prefix = 'hilum-chromium-',
  /** More command-line switches (a fake camera for the scanner's test). */
  extraArgs: string[] = [],
): Promise<TestBrowser> {
  const home = fs.mkdtempSync(path.join(os.tmpdir(), prefix));
  const browser = await chromium.launch({
    executablePath,
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
      ...extraArgs,
    ],
  });
  return Object.assign(browser, { cleanup: () => fs.rmSync(home, { recursive: true, force: true }) });
}
