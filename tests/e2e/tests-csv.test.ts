import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_BANK_NAME, DEMO_PASSWORD, seedDemo } from '../../server/db/seed-demo';
import { signIn } from '../helpers/accounts';
import { chromiumPath, launchBrowser, startTestServer } from '../helpers/browser';
import { speciesId } from '../helpers/lots';

// The people and the bank are the invented demo scenario of server/db/seed-demo.ts; the test in
// the file is invented too.
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
const DESKTOP = { width: 1280, height: 900 };

describe.skipIf(!chromiumPath)('importing germination tests in Chromium', () => {
  let server: Awaited<ReturnType<typeof startTestServer>>;
  let browser: Browser & { cleanup(): void };
  let bankId: string;

  beforeAll(async () => {
    server = await startTestServer({ now: new Date().toISOString() });
    await seedDemo(server.db);
    bankId = (await server.db.selectFrom('banks').select('id').where('name', '=', DEMO_BANK_NAME).executeTakeFirstOrThrow()).id;
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    browser?.cleanup();
    await server?.stop();
  });

  it('when a grower imports a small tests file, then the preview lists the test and the lot page shows it with its result', async () => {
    const api = await signIn(server.app, grower.email, DEMO_PASSWORD);
    const created = await api
      .post(`/api/banks/${bankId}/lots`)
      .send({ speciesId: await speciesId(server.db, 'tomato'), variety: 'Winter Window', origin: 'saved', harvestDate: '2025-09-01', seedCount: 150, code: 'TOM-WIN-1' });
    expect(created.status).toBe(201);
    const lot = created.body.lot as { id: string; code: string };
    const before = await server.db.selectFrom('stock_movements').select((eb) => eb.fn.sum<string>('change').as('s')).where('lot_id', '=', lot.id).executeTakeFirstOrThrow();
    const csv = [
      'test,lot_code,start_date,method,tray,seeds_sown,check_date,cumulative,finished_on,abnormal,ungerminated',
      `winter,${lot.code},2025-12-01,folded towel,1,25,2025-12-05,12,2025-12-12,1,4`,
      `winter,${lot.code},2025-12-01,folded towel,1,25,2025-12-12,20,2025-12-12,1,4`,
      `winter,${lot.code},2025-12-01,folded towel,2,25,2025-12-05,15,2025-12-12,0,4`,
      `winter,${lot.code},2025-12-01,folded towel,2,25,2025-12-12,21,2025-12-12,0,4`,
    ].join('\r\n');

    const context = await browser.newContext({ viewport: DESKTOP });
    const page = await context.newPage();
    await page.goto(`${server.baseUrl}/sign-in`);
    await page.getByLabel('E-mail').fill(grower.email);
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(`${server.baseUrl}/banks/${bankId}/overview`);

    await page.goto(`${server.baseUrl}/banks/${bankId}/lots`);
    expect(await page.getByRole('link', { name: 'Export tests CSV' }).getAttribute('href')).toBe(`/api/banks/${bankId}/tests.csv`);
    await page.getByRole('link', { name: 'Import CSV' }).first().click();
    await page.getByRole('radio', { name: /Germination tests/ }).check();
    await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe('Import germination tests from CSV');
    expect(await page.getByText('their seeds are not taken from the lots’ stock').count()).toBe(1);
    await page.getByLabel('CSV file').setInputFiles({ name: 'tests.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });

    const preview = page.getByRole('table', { name: 'Germination tests the file would add' });
    await expect.poll(() => preview.getByRole('row').count()).toBe(2);
    const row = await preview.getByRole('row').nth(1).innerText();
    expect(row).toContain(lot.code);
    expect(row).toContain('2 trays');
    expect(row).toContain('50 seeds');
    expect(row).toContain('2 check days');

    await page.getByRole('button', { name: 'Import 1 germination test' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: '1 germination test was added' }).count()).toBe(1);

    await page.goto(`${server.baseUrl}/banks/${bankId}/lots/${lot.id}`);
    const item = page.getByRole('list', { name: 'Germination tests of this lot' }).getByRole('listitem').filter({ hasText: 'folded towel' });
    await expect.poll(() => item.count()).toBe(1);
    const text = await item.innerText();
    expect(text).toContain('2 trays, 50 seeds');
    expect(text).toContain('Finished');
    expect(text).toContain('82'); // (20 + 21) normal seedlings of 50 seeds
    // History: the lot's stock ledger is unchanged.
    const after = await server.db.selectFrom('stock_movements').select((eb) => eb.fn.sum<string>('change').as('s')).where('lot_id', '=', lot.id).executeTakeFirstOrThrow();
    expect(after.s).toBe(before.s);

    // Deleting the imported test says it gives nothing back, and gives nothing back.
    await item.getByRole('link').first().click();
    await page.getByRole('button', { name: 'Delete this test…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Delete this test?' });
    await expect.poll(() => dialog.innerText()).toContain(`It took no seeds from lot ${lot.code}’s stock`);
    await dialog.getByRole('button', { name: 'Delete the test' }).click();
    await expect.poll(() => page.getByText(`Test deleted; lot ${lot.code}’s stock is as it was.`).count()).toBe(1);
    const afterDelete = await server.db.selectFrom('stock_movements').select((eb) => eb.fn.sum<string>('change').as('s')).where('lot_id', '=', lot.id).executeTakeFirstOrThrow();
    expect(afterDelete.s).toBe(before.s);
    await context.close();
  });
});
