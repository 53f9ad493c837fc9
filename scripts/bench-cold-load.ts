// The cold load on a slow phone: a first visit (empty cache) to the sign-in page, signing in as the
// demo bank's owner, and opening the Lots screen from the bank's navigation, in headless Chromium
// throttled like a slow rural phone connection (about 400 kbit/s each way, 400 ms round trip, the
// CPU four times slower; Chrome DevTools' own presets are of this order: "Slow 3G" is 400 kbit/s
// down, 400 ms). Reports the time until the first lot of the list is on screen (coldLoadLotsMs) and
// the JavaScript that crossed the wire, compressed, headers included (jsTransferKb; budget ≤ 200 KB),
// and the same without the response headers: the compressed scripts alone (jsBodyKb).
// Usage: tsx scripts/bench-cold-load.ts <built client dir>, with DATABASE_URL (scripts/bench.mjs).
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { systemClock } from '../server/clock';
import { loadConfig } from '../server/config';
import { createDb } from '../server/db/database';
import { migrateToLatest } from '../server/db/migrate';
import { createDemoSeason } from '../server/demo/demo-scenario';
import { DEMO_ACCOUNTS, DEMO_BANK_NAME, DEMO_PASSWORD } from '../server/demo/demo-people';
import { syncReferenceSpecies } from '../server/modules/species/reference-sync';
import { serveApp } from './lib/bench';
import { reportFigures } from './lib/bench-figures';
import { launchChromium } from '../tests/helpers/chromium';

const BUDGET_KB = 200;
/** The slow-phone profile: bytes/s for CDP's Network.emulateNetworkConditions. */
const NETWORK = {
  offline: false,
  latency: 400,
  downloadThroughput: 400_000 / 8,
  uploadThroughput: 400_000 / 8,
};
const CPU_SLOWDOWN = 4;

const staticDir = process.argv[2];
if (!staticDir || !fs.existsSync(path.join(staticDir, 'index.html')))
  throw new Error('usage: tsx scripts/bench-cold-load.ts <built client dir>');
const chromiumPath = process.env.HILUM_CHROMIUM ?? '/usr/bin/chromium';
if (!fs.existsSync(chromiumPath))
  throw new Error(`no Chromium at ${chromiumPath} (apt-get install chromium, or set HILUM_CHROMIUM)`);

const config = { ...loadConfig(), staticDir: path.resolve(staticDir) };
const db = createDb(config.databaseUrl);
await migrateToLatest(db);
await syncReferenceSpecies(db);
// The lot-list benchmark may have made the demo bank in this database already.
const seeded = await createDemoSeason({ db, clock: systemClock, appOrigin: config.appOrigin });
const bankId =
  seeded?.bankId ??
  (await db.selectFrom('banks').select('id').where('name', '=', DEMO_BANK_NAME).executeTakeFirstOrThrow()).id;
const app = await serveApp(config, db);
const owner = DEMO_ACCOUNTS.find((a) => a.role === 'owner')!;

// Debian's chromium, headless, with a fresh profile and no background traffic (as the browser tests).
const browser = await launchChromium(chromiumPath, 'hilum-bench-chromium-');
try {
  // A phone-sized window in a context of its own: nothing cached. The service worker is kept out, so
  // every script the visit needs crosses the throttled connection as the page's own request (the
  // DevTools protocol neither throttles nor reports a worker's fetches to the page); what the
  // worker costs a first visit is added below.
  const context = await browser.newContext({
    viewport: { width: 390, height: 844 },
    isMobile: true,
    serviceWorkers: 'block',
  });
  // HILUM_BENCH_IDENTITY=1: the same visit asking for no compression, for comparison.
  if (process.env.HILUM_BENCH_IDENTITY === '1')
    await context.setExtraHTTPHeaders({ 'accept-encoding': 'identity' });
  const page = await context.newPage();
  const cdp = await context.newCDPSession(page);
  await cdp.send('Network.enable');
  await cdp.send('Network.emulateNetworkConditions', NETWORK);
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: CPU_SLOWDOWN });

  const scripts = new Map<string, { url: string; encoding: string; headerBytes: number }>();
  const wire = new Map<string, number>();
  cdp.on('Network.responseReceived', (e) => {
    if (e.type !== 'Script') return;
    const headers = Object.fromEntries(
      Object.entries(e.response.headers).map(([k, v]) => [k.toLowerCase(), String(v)]),
    );
    scripts.set(e.requestId, {
      url: e.response.url,
      encoding: headers['content-encoding'] ?? 'none',
      // Bytes received when the response starts: its status line and headers.
      headerBytes: e.response.encodedDataLength,
    });
  });
  cdp.on('Network.loadingFinished', (e) => wire.set(e.requestId, e.encodedDataLength));

  const started = performance.now();
  await page.goto(`${app.base}/sign-in`);
  await page.getByLabel('E-mail').fill(owner.email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(`${app.base}/banks/${bankId}/overview`, { timeout: 120_000 });
  await page.getByRole('navigation', { name: 'Bank' }).getByRole('link', { name: 'Lots' }).click();
  // The Lots screen itself (its address and its own heading, so the overview's lot links, still on
  // screen while the Lots screen's scripts load, do not count), then its first lot: a link to one
  // lot's page.
  await page.waitForURL(`${app.base}/banks/${bankId}/lots`, { timeout: 120_000 });
  await page
    .getByRole('heading', { level: 1, name: 'Lots', exact: true })
    .waitFor({ state: 'visible', timeout: 120_000 });
  await page
    .locator(`main a[href^="/banks/${bankId}/lots/"]`)
    .filter({ hasNotText: /new lot|import/i })
    .first()
    .waitFor({ state: 'visible', timeout: 120_000 });
  const coldLoadLotsMs = Math.round(performance.now() - started);
  // Scripts still arriving (preloads of the page) count too: wait until each has finished.
  const deadline = Date.now() + 60_000;
  while ([...scripts.keys()].some((id) => !wire.has(id)) && Date.now() < deadline)
    await new Promise((resolve) => setTimeout(resolve, 100));

  let bytes = 0;
  let headerBytes = 0;
  const encodings = new Map<string, number>();
  for (const [id, script] of scripts) {
    bytes += wire.get(id) ?? 0;
    headerBytes += script.headerBytes;
    encodings.set(script.encoding, (encodings.get(script.encoding) ?? 0) + 1);
  }
  const worker = await serviceWorkerCost(
    app.base,
    staticDir,
    [...scripts.values()].map((script) => new URL(script.url).pathname),
  );
  bytes += worker.bytes;
  const jsTransferKb = Math.round((bytes / 1024) * 10) / 10;
  const jsBodyKb = Math.round(((bytes - headerBytes) / 1024) * 10) / 10;
  const codings = [...encodings].map(([name, n]) => `${n} ${name}`).join(', ');
  console.log(
    `cold load on a slow phone (${NETWORK.downloadThroughput * 0.008} kbit/s, ${NETWORK.latency} ms RTT, CPU ×${CPU_SLOWDOWN}):`,
  );
  console.log(`  sign-in page → signed in → Lots screen with its first lot: ${coldLoadLotsMs} ms`);
  console.log(
    `  JavaScript on the wire: ${jsTransferKb} KB in ${scripts.size} file(s) (${codings}) and the service worker's ${worker.what} (budget ≤ ${BUDGET_KB} KB)`,
  );
  console.log(
    `  of which response headers ${Math.round((headerBytes / 1024) * 10) / 10} KB; the compressed scripts alone ${jsBodyKb} KB`,
  );
  reportFigures({ coldLoadLotsMs, jsTransferKb, jsBodyKb });
  await context.close();
} finally {
  await browser.close();
  browser.cleanup();
  await app.close();
  await db.destroy();
}

/**
 * What installing the service worker adds to a first visit: its own script, compressed as the
 * server sends it (headers included), and any precached script the page had not loaded itself
 * (each at its brotli copy's size; the precache is meant to hold none — it is the app shell).
 */
async function serviceWorkerCost(
  base: string,
  dir: string,
  loaded: string[],
): Promise<{ bytes: number; what: string }> {
  const script = await new Promise<number>((resolve, reject) => {
    http
      .get(`${base}/sw.js`, { headers: { 'accept-encoding': 'br, gzip' } }, (res) => {
        let size = res.rawHeaders.reduce((n, h) => n + h.length + 2, 0);
        res.on('data', (chunk: Buffer) => (size += chunk.length));
        res.on('end', () => resolve(size));
      })
      .on('error', reject);
  });
  const source = fs.readFileSync(path.join(dir, 'sw.js'), 'utf8');
  const precached = [...source.matchAll(/"url":"(assets\/[^"]+\.js)"/g)].map((m) => `/${m[1] ?? ''}`);
  const extra = precached.filter((url) => !loaded.includes(url));
  const extraBytes = extra.reduce((n, url) => {
    const file = path.join(dir, `${url}.br`);
    return n + fs.statSync(fs.existsSync(file) ? file : path.join(dir, url)).size;
  }, 0);
  return {
    bytes: script + extraBytes,
    what: `script ${(script / 1024).toFixed(1)} KB + ${extra.length} precached script(s) not loaded by the page ${(extraBytes / 1024).toFixed(1)} KB`,
  };
}
