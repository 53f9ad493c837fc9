import fs from 'node:fs';
import path from 'node:path';
import AxeBuilder from '@axe-core/playwright';
import type { BrowserContext, Page } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, beforeAll, beforeEach, it } from 'vitest';

const root = path.resolve(import.meta.dirname, '..', '..');

/**
 * A user journey in steps: each step saves a screenshot under .artifacts/journeys/<name>/ (git-
 * ignored); a failing step also saves the page's console log, then fails the test.
 */
export function journey(name: string, page: Page) {
  const dir = path.join(root, '.artifacts', 'journeys', name);
  fs.rmSync(dir, { recursive: true, force: true });
  fs.mkdirSync(dir, { recursive: true });
  const consoleLog: string[] = [];
  page.on('console', (m) => consoleLog.push(`[${m.type()}] ${m.text()}`));
  page.on('pageerror', (e) => consoleLog.push(`[pageerror] ${e.message}`));
  let n = 0;
  return {
    async step(label: string, run: () => Promise<void>) {
      const file = `${String(++n).padStart(2, '0')}-${label.replace(/[^a-z0-9]+/gi, '-').toLowerCase()}`;
      try {
        await run();
        await page.screenshot({ path: path.join(dir, `${file}.png`), fullPage: true });
      } catch (error) {
        await page
          .screenshot({ path: path.join(dir, `${file}-FAILED.png`), fullPage: true })
          .catch(() => undefined);
        fs.writeFileSync(path.join(dir, `${file}-console.log`), consoleLog.join('\n'));
        throw error;
      }
    },
    /** Saves a small screenshot for the README when HILUM_SCREENSHOTS=1 (kept out of normal runs). */
    async readmeShot(fileName: string) {
      if (process.env.HILUM_SCREENSHOTS !== '1') return;
      const out = path.join(root, 'docs', 'screenshots');
      fs.mkdirSync(out, { recursive: true });
      // Thumbnails load after the rows: wait for every image in view to be drawn.
      await page.waitForLoadState('networkidle');
      await page.waitForFunction(() => [...document.images].every((img) => img.complete));
      // A palette PNG: a third of the size, and a screen of flat colours loses nothing visible.
      await sharp(await page.screenshot({ type: 'png' }))
        .png({ palette: true, effort: 10 })
        .toFile(path.join(out, fileName));
    },
  };
}

export interface JourneyOfTests {
  /** The shared page: open from the enclosing describe block's beforeAll until its afterAll. */
  readonly page: Page;
  /** Declares one test that runs as one screenshotted step on the shared page. */
  step(title: string, run: (page: Page) => Promise<void>): void;
  /** As journey().readmeShot, on the shared page. */
  readmeShot(fileName: string): Promise<void>;
}

/**
 * A journey whose steps are tests of their own, in order, on one page shared by the enclosing
 * describe block: each step has the whole test timeout to itself, so a long journey on a busy machine
 * does not run into it, and the report names the step that failed. The page opens once (`open`
 * makes its browser context; `first`, e.g. signing in, runs once before the first step) and closes
 * after the last. Screenshots are saved as with journey().
 *
 * `chained` (the default) is for steps that build on each other: after a failed step the rest are
 * skipped, since they would fail for the same reason. Independent checks on one signed-in page (one
 * page of the app each) pass `chained: false`, so that each is checked whatever the others found.
 */
export function journeyOfTests(
  name: string,
  open: () => Promise<BrowserContext>,
  options: { first?: { title: string; run: (page: Page) => Promise<void> }; chained?: boolean } = {},
): JourneyOfTests {
  const { first, chained = true } = options;
  let context: BrowserContext | undefined;
  let shared: { page: Page; steps: ReturnType<typeof journey> } | undefined;
  let failed = false;
  beforeAll(async () => {
    context = await open();
    const page = await context.newPage();
    shared = { page, steps: journey(name, page) };
    if (first) await shared.steps.step(first.title, () => first.run(page));
  });
  afterAll(async () => {
    await context?.close();
  });
  if (chained) {
    beforeEach((test) => {
      if (failed) test.skip(`an earlier step of the journey "${name}" failed`);
    });
  }
  const opened = () => {
    if (!shared) throw new Error(`the journey "${name}" has no page: its beforeAll did not run or failed`);
    return shared;
  };
  return {
    get page() {
      return opened().page;
    },
    step(title, run) {
      it(title, async () => {
        const { page, steps } = opened();
        try {
          await steps.step(title, () => run(page));
        } catch (error) {
          failed = true;
          throw error;
        }
      });
    },
    readmeShot: (fileName) => opened().steps.readmeShot(fileName),
  };
}

/**
 * Serious and critical accessibility violations on the page as it is now (axe-core).
 * Two settings keep a check of a long page short on a busy machine without changing what it finds:
 * `resultTypes: ['violations']` skips building a selector for every node that passes (the speed-up
 * of axe-core's API.md, "Performance"), and legacy mode runs axe.run once in the page, since the
 * per-frame runPartial ignores resultTypes (dequelabs/axe-core#4427) and finishes in a second, blank
 * page; it is meant for frames from other origins, which our pages do not have. Measured on the
 * demo's Lots page on a busy 2-core machine: 37 s before, 6 s after.
 */
export async function seriousViolations(page: Page) {
  const results = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'])
    .options({ resultTypes: ['violations'] })
    .setLegacyMode()
    .analyze();
  return results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      nodes: v.nodes.slice(0, 3).map((x) => x.target.join(' ')),
    }));
}
