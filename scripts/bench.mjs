// `npm run bench`: the ranking benchmark on a throwaway PostgreSQL cluster, and the client's
// initial bundle size. Prints figures; it is not a test and asserts nothing but that it ran.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ensureDependencies, ensurePostgres, fail, freePort, log, root, startPostgres } from './lib/services.mjs';

let pg;
try {
  ensureDependencies();
  const bin = ensurePostgres();
  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-bench-'));
  fs.chmodSync(tmp, 0o755);
  pg = await startPostgres({ bin, dataDir: tmp, port: await freePort(), database: 'hilum_bench', durable: false });
  log('running the ranking benchmark (5,000 lots, 25,000 tests, 150,000 counts)…');
  const bench = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/bench-ranking.ts'], {
    cwd: root,
    stdio: 'inherit',
    env: { ...process.env, DATABASE_URL: pg.url, NODE_ENV: 'test', LOG_LEVEL: 'silent', HILUM_DATA_DIR: tmp, AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true' },
  });
  pg.stop();
  pg = null;
  fs.rmSync(tmp, { recursive: true, force: true });
  if (bench.status !== 0) process.exit(bench.status ?? 1);

  log('building the client to measure its initial JavaScript…');
  const out = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-bundle-'));
  const build = spawnSync(path.join(root, 'node_modules', '.bin', 'vite'), ['build', '--logLevel', 'error', '--outDir', out], { cwd: root, stdio: 'inherit' });
  if (build.status !== 0) process.exit(1);
  spawnSync(process.execPath, ['--import', 'tsx', 'scripts/bench-bundle.ts', out], { cwd: root, stdio: 'inherit' });
  fs.rmSync(out, { recursive: true, force: true });
} catch (error) {
  pg?.stop();
  fail(error);
}
