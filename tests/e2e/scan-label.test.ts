import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '#server/demo/demo-people';
import { browserSuite, chromiumPath, signInThroughApi } from '../helpers/browser';
import { launchChromium, type TestBrowser } from '../helpers/chromium';

// The people and the bank are the invented demo scenario of server/demo/demo-people.ts; the lot is
// invented for this file. The camera is Chromium's own fake capture device, playing a picture of
// the lot's real packet label (the server's label.svg, drawn by librsvg through sharp).
const grower = DEMO_ACCOUNTS.find((a) => a.role === 'grower')!;
// 390 × 844 CSS pixels: the viewport of a common mid-size phone held upright (from memory).
const PHONE = { width: 390, height: 844 };

/** The label on a white bench, 640 × 480, as JPEG frames of the MJPEG file Chromium's fake camera plays. */
async function cameraFile(labelSvg: string, dir: string): Promise<string> {
  // At density 125 sharp draws the 70 mm label about 600 px wide (tests/api/labels.test.ts).
  const label = await sharp(Buffer.from(labelSvg), { density: 125 })
    .resize({ width: 560, height: 400, fit: 'inside' })
    .flatten({ background: '#ffffff' })
    .png()
    .toBuffer();
  const frame = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#ffffff' } })
    .composite([{ input: label, gravity: 'centre' }])
    .jpeg({ quality: 92 })
    .toBuffer();
  const file = path.join(dir, 'label.mjpeg');
  fs.writeFileSync(file, Buffer.concat(Array.from({ length: 10 }, () => frame)));
  return file;
}

describe.skipIf(!chromiumPath)('scanning a packet label, in Chromium', () => {
  const suite = browserSuite({ now: '2026-03-14T09:00:00Z', demo: 'people' });
  let lot: { id: string; code: string };
  let dir: string;
  let withCamera: TestBrowser;

  beforeAll(async () => {
    const api = request.agent(suite.server.app);
    expect(
      (await api.post('/api/auth/login').send({ email: grower.email, password: DEMO_PASSWORD })).status,
    ).toBe(200);
    const species = await api.get(`/api/banks/${suite.bankId}/species`);
    const tomato = (species.body.items as { id: string; commonName: string }[]).find((s) =>
      /^tomato$/i.test(s.commonName),
    );
    const created = await api.post(`/api/banks/${suite.bankId}/lots`).send({
      speciesId: tomato!.id,
      variety: 'Scanned Packet Pink',
      origin: 'saved',
      harvestDate: '2025-09-12',
      seedCount: 120,
    });
    expect(created.status).toBe(201);
    lot = created.body.lot;
    const svg = await api.get(`/api/banks/${suite.bankId}/lots/${lot.id}/label.svg`).buffer(true);
    expect(svg.status).toBe(200);
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-scan-'));
    const file = await cameraFile(svg.body.toString('utf8'), dir);
    withCamera = await launchChromium(chromiumPath, 'hilum-chromium-camera-', [
      '--use-fake-ui-for-media-stream',
      '--use-fake-device-for-media-stream',
      `--use-file-for-fake-video-capture=${file}`,
    ]);
  }, 60_000);
  afterAll(async () => {
    await withCamera?.close();
    withCamera?.cleanup();
    if (dir) fs.rmSync(dir, { recursive: true, force: true });
  });

  it('when the camera sees a packet label, then its lot page opens, the decoder having loaded only then', async () => {
    const context = await withCamera.newContext({ viewport: PHONE, isMobile: true, hasTouch: true });
    await context.grantPermissions(['camera'], { origin: suite.server.baseUrl });
    await signInThroughApi(context, suite.server.baseUrl, grower.email);
    const page = await context.newPage();
    const scripts: string[] = [];
    page.on('request', (req) => {
      if (req.resourceType() === 'script') scripts.push(new URL(req.url()).pathname);
    });
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots`);
    const scan = page.getByRole('button', { name: 'Scan a packet label' });
    await scan.waitFor();
    // Linux Chromium has no BarcodeDetector, so the fallback decoder reads the picture here.
    expect(await page.evaluate(() => 'BarcodeDetector' in window)).toBe(false);
    expect(scripts.filter((s) => /jsQR|scan-dialog/.test(s))).toEqual([]);
    await scan.tap();
    await page.waitForURL(`${suite.server.baseUrl}/banks/${suite.bankId}/lots/${lot.id}`);
    await expect.poll(() => page.locator('main').innerText()).toContain(lot.code);
    expect(scripts.some((s) => /jsQR/.test(s))).toBe(true);
    // The camera is let go once the lot opens.
    await expect.poll(() => page.locator('video').count()).toBe(0);
    await context.close();
  });

  it('when the camera is refused, then the scanner says so in words', async () => {
    // The shared browser has no fake camera and no camera permission was granted.
    const context = await suite.browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true });
    await signInThroughApi(context, suite.server.baseUrl, grower.email);
    const page = await context.newPage();
    await page.goto(`${suite.server.baseUrl}/banks/${suite.bankId}/lots`);
    await page.getByRole('button', { name: 'Scan a packet label' }).tap();
    const problem = page.getByRole('dialog').getByRole('alert');
    await expect.poll(() => problem.innerText()).toMatch(/camera/i);
    expect(await problem.innerText()).toMatch(/Lots list|try again/);
    await page.getByRole('dialog').getByRole('button', { name: 'Close' }).tap();
    await expect.poll(() => page.getByRole('dialog').count()).toBe(0);
    await context.close();
  });
});
