import type { Page } from 'playwright-core';
import { beforeAll, describe, expect } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { signIn } from '../helpers/accounts';
import { browserSuite, chromiumPath, signInAt } from '../helpers/browser';
import { journeyOfTests } from '../helpers/journey';
import { speciesId } from '../helpers/lots';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts; the test in
// the file is invented too.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
const DESKTOP = { width: 1280, height: 900 };

describe.skipIf(!chromiumPath)('importing germination tests in Chromium', () => {
  const suite = browserSuite({ now: new Date().toISOString(), demo: 'people' });

  // One test per step on one page: the whole import in one test ran near the 60 s timeout.
  describe('when a grower imports a small tests file, then the preview lists the test and the lot page shows it with its result', () => {
    let lot: { id: string; code: string };
    let before: string | null;
    const stock = async () =>
      (
        await suite.server.db
          .selectFrom('stock_movements')
          .select((eb) => eb.fn.sum<string>('change').as('s'))
          .where('lot_id', '=', lot.id)
          .executeTakeFirstOrThrow()
      ).s;
    beforeAll(async () => {
      const api = await signIn(suite.server.app, grower.email, DEMO_PASSWORD);
      const created = await api.post(`/api/banks/${suite.bankId}/lots`).send({
        speciesId: await speciesId(suite.server.db, 'tomato'),
        variety: 'Winter Window',
        origin: 'saved',
        harvestDate: '2025-09-01',
        seedCount: 150,
        code: 'TOM-WIN-1',
      });
      expect(created.status).toBe(201);
      lot = created.body.lot as { id: string; code: string };
      before = await stock();
    });
    const csv = () =>
      [
        'test,lot_code,start_date,method,tray,seeds_sown,check_date,cumulative,finished_on,abnormal,ungerminated',
        `winter,${lot.code},2025-12-01,folded towel,1,25,2025-12-05,12,2025-12-12,1,4`,
        `winter,${lot.code},2025-12-01,folded towel,1,25,2025-12-12,20,2025-12-12,1,4`,
        `winter,${lot.code},2025-12-01,folded towel,2,25,2025-12-05,15,2025-12-12,0,4`,
        `winter,${lot.code},2025-12-01,folded towel,2,25,2025-12-12,21,2025-12-12,0,4`,
      ].join('\r\n');
    const assayItem = (page: Page) =>
      page
        .getByRole('list', { name: 'Germination tests of this lot' })
        .getByRole('listitem')
        .filter({ hasText: 'folded towel' });

    const j = journeyOfTests('tests-csv', () => suite.browser.newContext({ viewport: DESKTOP }), {
      first: {
        title: 'sign in as grower',
        run: (page) => signInAt(page, suite.server.baseUrl, grower.email, suite.bankId),
      },
    });
    j.step('open the tests import from the lots page', async (page) => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots`);
      expect(await page.getByRole('link', { name: 'Export tests CSV' }).getAttribute('href')).toBe(
        `/api/banks/${suite.bankId}/tests.csv`,
      );
      await page.getByRole('link', { name: 'Import CSV' }).first().click();
      await page.getByRole('radio', { name: /Germination tests/ }).check();
      await expect
        .poll(() => page.getByRole('heading', { level: 1 }).innerText())
        .toBe('Import germination tests from CSV');
      expect(await page.getByText('their seeds are not taken from the lots’ stock').count()).toBe(1);
    });
    j.step('preview the file', async (page) => {
      await page
        .getByLabel('CSV file')
        .setInputFiles({ name: 'tests.csv', mimeType: 'text/csv', buffer: Buffer.from(csv()) });
      const preview = page.getByRole('table', { name: 'Germination tests the file would add' });
      await expect.poll(() => preview.getByRole('row').count()).toBe(2);
      const row = await preview.getByRole('row').nth(1).innerText();
      expect(row).toContain(lot.code);
      expect(row).toContain('2 trays');
      expect(row).toContain('50 seeds');
      expect(row).toContain('2 check days');
    });
    j.step('import it', async (page) => {
      await page.getByRole('button', { name: 'Import 1 germination test' }).click();
      await expect
        .poll(() => page.getByRole('status').filter({ hasText: '1 germination test was added' }).count())
        .toBe(1);
    });
    j.step('the lot page shows it with its result, and the stock is as it was', async (page) => {
      await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lot.id}`);
      const item = assayItem(page);
      await expect.poll(() => item.count()).toBe(1);
      const text = await item.innerText();
      expect(text).toContain('2 trays, 50 seeds');
      expect(text).toContain('Finished');
      expect(text).toContain('82'); // (20 + 21) normal seedlings of 50 seeds
      // History: the lot's stock ledger is unchanged.
      expect(await stock()).toBe(before);
    });
    j.step('deleting the imported test says it gives nothing back, and gives nothing back', async (page) => {
      await assayItem(page).getByRole('link').first().click();
      await page.getByRole('button', { name: 'Delete this test…' }).click();
      const dialog = page.getByRole('dialog', { name: 'Delete this test?' });
      await expect.poll(() => dialog.innerText()).toContain(`It took no seeds from lot ${lot.code}’s stock`);
      await dialog.getByRole('button', { name: 'Delete the test' }).click();
      await expect
        .poll(() => page.getByText(`Test deleted; lot ${lot.code}’s stock is as it was.`).count())
        .toBe(1);
      expect(await stock()).toBe(before);
    });
  });
});
