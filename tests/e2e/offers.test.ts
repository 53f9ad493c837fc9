import { describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { PASSWORD, signIn, signUp } from '../helpers/accounts';
import { browserSuite, chromiumPath, signInAt, signInThroughApi } from '../helpers/browser';
import { seriousViolations } from '../helpers/journey';
import { finishedAssay, speciesId } from '../helpers/lots';

// The people and the first bank are the invented demo scenario of server/demo/demo-people.ts; the
// second bank and the lot are invented here.
const owner = DEMO_ACCOUNTS.find((a) => a.role === 'owner')!;

describe.skipIf(!chromiumPath)('giving part of a lot to another bank in Chromium', () => {
  const suite = browserSuite({ demo: 'people' });

  it('when a member of two banks gives part of a lot to the second and accepts it there, then the new lot shows the giver’s tests', async () => {
    const { app, db } = suite.server;
    const api = await signIn(app, owner.email, DEMO_PASSWORD);
    const second = await api.post('/api/banks').send({ name: 'Wicker Gate Allotment' });
    expect(second.status).toBe(201);
    const secondId: string = second.body.bank.id;
    const created = await api.post(`/api/banks/${suite.bankId}/lots`).send({
      speciesId: await speciesId(db, 'tomato'),
      variety: 'Sunward Pear',
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount: 300,
      notes: 'Kept apart from the striped ones',
    });
    expect(created.status).toBe(201);
    const lot = created.body.lot as { id: string; code: string };
    // 46 + 45 normal seedlings of 50 + 50 sown: 91% pooled (germinated / sown, by hand).
    await finishedAssay(api, suite.bankId, lot.id, '2025-10-01', [
      { sown: 50, germinated: 46 },
      { sown: 50, germinated: 45 },
    ]);

    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInAt(page, suite.server.baseUrl, owner.email, suite.bankId);
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lot.id}`);
    const give = page.getByRole('region', { name: 'Give to another bank' });
    await give.getByLabel('Seeds to give').fill('80');
    await give.getByLabel('Give to').selectOption({ label: 'Wicker Gate Allotment' });
    await expect.poll(() => give.getByRole('note').innerText()).toMatch(/phytosanitary/);
    await give.getByRole('button', { name: 'Offer seeds' }).click();
    await expect.poll(() => give.getByText('Offered 80 seeds to Wicker Gate Allotment.').count()).toBe(1);
    const offers = give.getByRole('list', { name: `Offers of ${lot.code}` }).getByRole('listitem');
    await expect.poll(() => offers.first().innerText()).toMatch(/80 seeds to Wicker Gate Allotment · Open/);
    // Offered, not moved: 300 − 100 sown in the test = 200 still on hand.
    expect((await api.get(`/api/banks/${suite.bankId}/lots/${lot.id}`)).body.lot.seedsOnHand).toBe(200);

    // Over in the second bank, the circle's list has it; accepting opens the new lot.
    await page.goto(`${suite.server.baseUrl}/banks/${secondId}/offers`);
    const toMe = page.getByRole('list', { name: 'Offered to your banks' }).getByRole('listitem');
    await expect.poll(() => toMe.filter({ hasText: 'Sunward Pear' }).innerText()).toMatch(/latest test 91%/);
    expect(await seriousViolations(page)).toEqual([]);
    await toMe
      .filter({ hasText: 'Sunward Pear' })
      .getByRole('button', { name: 'Accept into Wicker Gate Allotment' })
      .click();
    await page.waitForURL(new RegExp(`/banks/${secondId}/lots/[0-9a-f-]{36}$`));
    const history = page.getByRole('region', { name: 'History from the giver' });
    await expect
      .poll(() => history.innerText())
      .toContain(`Received 80 seeds from lot ${lot.code} of Larkspur Hollow Seed Circle.`);
    await expect.poll(() => history.innerText()).toMatch(/91% germinated \(91 of 100 seeds\)/);
    await expect.poll(() => history.innerText()).toMatch(/giver’s evidence, read-only/);
    // The giver's private note did not come along.
    expect(await page.locator('main').innerText()).not.toContain('Kept apart from the striped ones');
    expect(await seriousViolations(page)).toEqual([]);

    // Moved once: 120 left with the giver, 80 in the new lot.
    const newLotId = page.url().split('/').at(-1)!;
    expect((await api.get(`/api/banks/${suite.bankId}/lots/${lot.id}`)).body.lot.seedsOnHand).toBe(120);
    expect((await api.get(`/api/banks/${secondId}/lots/${newLotId}`)).body.lot.seedsOnHand).toBe(80);
    await page.close();
  });

  it('when the giver makes a link without the bank’s name, then someone with another Hilum bank opens it and accepts the seed', async () => {
    const { app, db } = suite.server;
    const api = await signIn(app, owner.email, DEMO_PASSWORD);
    const created = await api.post(`/api/banks/${suite.bankId}/lots`).send({
      speciesId: await speciesId(db, 'tomato'),
      variety: 'Moth Wing',
      origin: 'saved',
      harvestDate: '2025-09-01',
      seedCount: 150,
    });
    const lot = created.body.lot as { id: string; code: string };
    await finishedAssay(api, suite.bankId, lot.id, '2025-10-01', [{ sown: 50, germinated: 44 }]);

    const page = await suite.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInAt(page, suite.server.baseUrl, owner.email, suite.bankId);
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lot.id}`);
    const give = page.getByRole('region', { name: 'Give to another bank' });
    await give.getByLabel('Seeds to give').fill('25');
    await give.getByLabel('Give to').selectOption({ label: 'Anyone with a Hilum bank, by a link' });
    await give.getByLabel(/Show this bank’s name/).uncheck();
    await give.getByRole('button', { name: 'Offer seeds' }).click();
    await expect.poll(() => give.getByTestId('offer-link').count()).toBe(1);
    const link = await give.getByTestId('offer-link').innerText();
    expect(link).toMatch(
      new RegExp(`^${suite.server.baseUrl}/offers/[0-9a-f-]{36}\\?token=[A-Za-z0-9_-]{43}$`),
    );
    await page.close();

    // Someone outside the circle, with a bank of their own (invented), opens the link.
    const other = await signUp(app, { name: 'Noor Vantage' });
    await other.agent.post('/api/banks').send({ name: 'Quarry Steps Garden' });
    const context = await suite.browser.newContext({ viewport: { width: 1280, height: 900 } });
    await signInThroughApi(context, suite.server.baseUrl, other.email, PASSWORD);
    const theirs = await context.newPage();
    await theirs.goto(link);
    await expect.poll(() => theirs.getByRole('heading', { level: 1 }).innerText()).toBe('Seed on offer');
    await expect.poll(() => theirs.locator('main').innerText()).toContain('25 seeds of Tomato “Moth Wing”');
    // 44 of 50 normal seedlings: 88% (by hand).
    await expect.poll(() => theirs.locator('main').innerText()).toMatch(/88% germinated \(44 of 50 seeds\)/);
    expect(await theirs.locator('main').innerText()).not.toContain('Larkspur Hollow');
    await expect.poll(() => theirs.getByRole('note').first().innerText()).toMatch(/phytosanitary/);
    expect(await seriousViolations(theirs)).toEqual([]);
    await theirs.getByRole('button', { name: 'Accept the seed' }).click();
    await theirs.waitForURL(/\/banks\/[0-9a-f-]{36}\/lots\/[0-9a-f-]{36}$/);
    const history = theirs.getByRole('region', { name: 'History from the giver' });
    await expect
      .poll(() => history.innerText())
      .toContain(`Received 25 seeds from lot ${lot.code} of another Hilum bank.`);
    await context.close();
    // 150 − 50 sown in the test − 25 given = 75 left with the giver.
    expect((await api.get(`/api/banks/${suite.bankId}/lots/${lot.id}`)).body.lot.seedsOnHand).toBe(75);
  });
});
