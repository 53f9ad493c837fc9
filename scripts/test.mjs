// `npm test`: the whole suite on throwaway services (never the data of `npm start`).
// Type check and lint, then a temporary PostgreSQL cluster, object store and outbox on free
// ports, a client build, and Vitest over unit, API and browser tests. Extra arguments go to Vitest.
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import {
  SetupError,
  ensureDependencies,
  ensurePostgres,
  fail,
  freePort,
  log,
  root,
  startFakes,
  startPostgres,
  stopChild,
} from './lib/services.mjs';

const cleanups = [];
async function cleanup() {
  for (const step of cleanups.reverse()) {
    try {
      await step();
    } catch {
      // keep cleaning
    }
  }
  cleanups.length = 0;
}

function step(name, cmd, args, env = process.env) {
  log(name);
  const result = spawnSync(cmd, args, { cwd: root, stdio: 'inherit', env });
  if (result.status !== 0) throw new SetupError(`${name} failed`);
}

/** Debian's chromium for the browser tests: installed when missing and running as root. */
function ensureChromium() {
  if (fs.existsSync('/usr/bin/chromium')) return '/usr/bin/chromium';
  if (process.getuid?.() === 0) {
    log('installing Debian chromium for the browser tests (apt-get install chromium)…');
    const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
    spawnSync('apt-get', ['update'], { stdio: 'inherit', env });
    spawnSync('apt-get', ['install', '-y', '--no-install-recommends', 'chromium'], { stdio: 'inherit', env });
    if (fs.existsSync('/usr/bin/chromium')) return '/usr/bin/chromium';
  }
  process.stderr.write(
    '\n' +
      '!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!\n' +
      '!! chromium is not installed: the BROWSER TESTS WILL BE SKIPPED.              !!\n' +
      '!! Install it with: sudo apt-get install -y chromium                          !!\n' +
      '!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!\n\n',
  );
  return '';
}

/**
 * Debian's nginx for the test of two app servers behind a load balancer: installed when missing and
 * running as root. The package starts its own nginx on port 80; the test runs one of its own on a
 * free loopback port instead, so that one is stopped.
 */
function ensureNginx() {
  if (fs.existsSync('/usr/sbin/nginx')) return '/usr/sbin/nginx';
  if (process.getuid?.() === 0) {
    log('installing Debian nginx for the load-balancer test (apt-get install nginx)…');
    const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
    spawnSync('apt-get', ['update'], { stdio: 'inherit', env });
    spawnSync('apt-get', ['install', '-y', '--no-install-recommends', 'nginx'], { stdio: 'inherit', env });
    spawnSync('service', ['nginx', 'stop'], { stdio: 'ignore' });
    if (fs.existsSync('/usr/sbin/nginx')) return '/usr/sbin/nginx';
  }
  process.stderr.write(
    '\n' +
      '!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!\n' +
      '!! nginx is not installed: the TWO-SERVER LOAD-BALANCER TEST WILL BE SKIPPED. !!\n' +
      '!! Install it with: sudo apt-get install -y nginx && sudo service nginx stop  !!\n' +
      '!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!!\n\n',
  );
  return '';
}

async function main() {
  ensureDependencies();
  const vitestArgs = process.argv.slice(2);
  const quick = vitestArgs.length > 0;
  if (!quick) {
    step('type check (client, server and tests configs)', process.execPath, ['scripts/typecheck.mjs']);
    step('lint (eslint)', process.execPath, [
      'node_modules/eslint/bin/eslint.js',
      '.',
      '--max-warnings',
      '0',
    ]);
    step('format (prettier --check; `npm run format` fixes it)', process.execPath, [
      'node_modules/prettier/bin/prettier.cjs',
      '--check',
      '.',
      '--log-level',
      'warn',
    ]);
  }
  const chromium = ensureChromium();
  const nginx = ensureNginx();
  const bin = ensurePostgres();

  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'hilum-test-'));
  fs.chmodSync(tmp, 0o755);
  cleanups.push(() => fs.rmSync(tmp, { recursive: true, force: true }));

  const [pgPort, s3Port, smtpPort] = [await freePort(), await freePort(), await freePort()];
  const pg = await startPostgres({ bin, dataDir: tmp, port: pgPort, database: 'postgres', durable: false });
  cleanups.push(() => pg.stop());
  const fakes = await startFakes({
    s3Port,
    smtpPort,
    s3Dir: path.join(tmp, 's3'),
    outboxDir: path.join(tmp, 'outbox'),
  });
  cleanups.push(() => stopChild(fakes.children.s3));
  cleanups.push(() => stopChild(fakes.children.smtp));

  const staticDir = path.join(tmp, 'dist');
  step('client build (vite build)', path.join(root, 'node_modules', '.bin', 'vite'), [
    'build',
    '--logLevel',
    'warn',
    '--outDir',
    staticDir,
    '--emptyOutDir',
  ]);

  const env = {
    ...process.env,
    ...fakes.env,
    NODE_ENV: 'test',
    LOG_LEVEL: 'silent',
    HILUM_DATA_DIR: tmp,
    // Tests create a database of their own per file from this server's admin database.
    HILUM_TEST_ADMIN_URL: pg.url,
    DATABASE_URL: pg.url,
    STATIC_DIR: staticDir,
    HILUM_CHROMIUM: chromium,
    HILUM_NGINX: nginx,
    // This machine's Node is 20, which the object-store SDK warns about on every start (known; the
    // SDK's own switch for it). Production should run a current Node LTS instead.
    AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED:
      process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ?? 'true',
    HILUM_S3_PORT: String(s3Port),
    HILUM_S3_DIR: path.join(tmp, 's3'),
  };
  log('running the suite (vitest)');
  const vitest = spawn(process.execPath, ['node_modules/vitest/vitest.mjs', 'run', ...vitestArgs], {
    cwd: root,
    env,
    stdio: 'inherit',
  });
  const onSignal = () => vitest.kill('SIGTERM');
  process.on('SIGINT', onSignal);
  process.on('SIGTERM', onSignal);
  const code = await new Promise((resolve) => vitest.once('exit', (c) => resolve(c ?? 1)));
  await cleanup();
  process.exit(code);
}

main().catch(async (error) => {
  await cleanup();
  fail(error);
});
