// `npm run bench`: the ranking and lot-list benchmarks on a throwaway PostgreSQL cluster, the
// client's initial bundle size, and a cold load of the Lots screen in headless Chromium throttled
// like a slow phone (the app on that cluster too). Prints figures; it is not a test and asserts nothing but that it ran.
// `npm run bench -- --json` prints the same figures as one JSON object on stdout, and everything
// else (the readable report, set-up messages, child processes' output) on stderr.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import {
  ensureDependencies,
  ensurePostgres,
  fail,
  freePort,
  log,
  root,
  startPostgres,
} from './lib/services.mjs';

/** Each benchmark writes its figures to a file of this folder (HILUM_BENCH_FIGURES). */
const FIGURES = [
  'rankingLots',
  'rankingHttpMedianMs',
  'rankingRawSelectMedianMs',
  'lotListReqPerSec',
  'bareExpressReqPerSec',
  'initialJsGzipKb',
  'coldLoadLotsMs',
  'jsTransferKb',
  'jsBodyKb',
];

if (process.argv.includes('--json')) {
  // The readable run again as a child whose stdout is our stderr, so nothing but the JSON reaches stdout.
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-bench-figures-'));
  const args = process.argv.slice(2).filter((a) => a !== '--json');
  const run = spawnSync(process.execPath, [fileURLToPath(import.meta.url), ...args], {
    cwd: root,
    stdio: ['ignore', 2, 2],
    env: { ...process.env, HILUM_BENCH_FIGURES_DIR: dir },
  });
  const figures = Object.fromEntries(FIGURES.map((name) => [name, null]));
  for (const file of fs.readdirSync(dir))
    Object.assign(figures, JSON.parse(fs.readFileSync(path.join(dir, file), 'utf8')));
  fs.rmSync(dir, { recursive: true, force: true });
  if (run.status !== 0) process.exit(run.status ?? 1);
  process.stdout.write(`${JSON.stringify(figures)}\n`);
  process.exit(0);
}

const figuresDir = process.env.HILUM_BENCH_FIGURES_DIR;
/** Runs a TypeScript benchmark script with tsx; its figures land in figuresDir/<name>.json. */
function runScript(script, args, env = {}) {
  const name = path.basename(script, '.ts');
  return spawnSync(process.execPath, ['--import', 'tsx', script, ...args], {
    cwd: root,
    stdio: 'inherit',
    env: {
      ...process.env,
      ...env,
      ...(figuresDir ? { HILUM_BENCH_FIGURES: path.join(figuresDir, `${name}.json`) } : {}),
    },
  });
}

/** `--only=lots` (or ranking, bundle, coldload) runs one benchmark, for quick comparisons while working. */
const only = process.argv.find((a) => a.startsWith('--only='))?.slice('--only='.length);
const runs = (name) => !only || only === name;

let pg;
try {
  ensureDependencies();
  const bin = ensurePostgres();
  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-bench-'));
  fs.chmodSync(tmp, 0o755);
  pg = await startPostgres({
    bin,
    dataDir: tmp,
    port: await freePort(),
    database: 'hilum_bench',
    durable: false,
  });
  const env = {
    DATABASE_URL: pg.url,
    NODE_ENV: 'test',
    LOG_LEVEL: 'silent',
    HILUM_DATA_DIR: tmp,
    AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true',
    // The lot-list benchmark reports PostgreSQL's CPU per request from its processes.
    HILUM_BENCH_PG_PIDFILE: path.join(tmp, 'pg', 'postmaster.pid'),
  };
  let ranking = { status: 0 };
  if (runs('ranking')) {
    log('running the ranking benchmark (5,000 lots, 25,000 tests, 150,000 counts)…');
    ranking = runScript('scripts/bench-ranking.ts', [], env);
  }
  let lots = ranking;
  if (ranking.status === 0 && runs('lots')) {
    log('running the lot-list benchmark (the demo bank, concurrency 20)…');
    lots = runScript('scripts/bench-lots.ts', [], env);
  }
  if (lots.status !== 0) {
    pg.stop();
    process.exit(lots.status ?? 1);
  }

  let out = null;
  if (runs('bundle') || runs('coldload')) {
    log('building the client…');
    out = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-bundle-'));
    const build = spawnSync(
      path.join(root, 'node_modules', '.bin', 'vite'),
      ['build', '--logLevel', 'error', '--outDir', out],
      { cwd: root, stdio: 'inherit' },
    );
    if (build.status !== 0) throw new Error('the client build failed');
  }
  if (runs('coldload')) {
    log('running the cold-load benchmark (headless Chromium, slow phone profile)…');
    const cold = runScript('scripts/bench-cold-load.ts', [out], env);
    if (cold.status !== 0) throw new Error('the cold-load benchmark failed');
  }
  pg.stop();
  pg = null;
  fs.rmSync(tmp, { recursive: true, force: true });

  if (runs('bundle')) {
    const bundle = runScript('scripts/bench-bundle.ts', [out]);
    if (bundle.status !== 0) throw new Error('the bundle benchmark failed');
  }
  if (out) fs.rmSync(out, { recursive: true, force: true });
} catch (error) {
  pg?.stop();
  fail(error);
}
