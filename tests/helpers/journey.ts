import fs from 'node:fs';
import path from 'node:path';
import AxeBuilder from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import sharp from 'sharp';

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
        await page.screenshot({ path: path.join(dir, `${file}-FAILED.png`), fullPage: true }).catch(() => undefined);
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

/** Serious and critical accessibility violations on the page as it is now (axe-core). */
export async function seriousViolations(page: Page) {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  return results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.slice(0, 3).map((x) => x.target.join(' ')) }));
}
