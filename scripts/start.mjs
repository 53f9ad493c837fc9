// `npm start` (and `npm run dev` with --dev): brings up everything Hilum needs on this machine.
// Dependencies, PostgreSQL, the object-store and SMTP fakes, migrations, demo data, the app.
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import {
  SetupError,
  assertPortsFree,
  buildClientIfStale,
  ensureDependencies,
  ensurePostgres,
  ensureWritableDir,
  fail,
  findPostgresBin,
  log,
  root,
  startFakes,
  startPostgres,
  stopChild,
} from './lib/services.mjs';
import { supervise } from './lib/supervise.mjs';

const dev = process.argv.includes('--dev');
const resetDemo = process.argv.includes('--reset-demo');

function intFromEnv(name, fallback) {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value < 1 || value > 65535) {
    throw new SetupError(`${name}=${raw} is not a port number (1–65535)`);
  }
  return value;
}

const cleanups = [];
let stopping = false;

async function stopAll(code = 0) {
  if (stopping) return;
  stopping = true;
  log('stopping…');
  for (const cleanup of cleanups.reverse()) {
    try {
      await cleanup();
    } catch {
      // keep stopping the rest
    }
  }
  process.exit(code);
}

async function main() {
  const dataDir = path.resolve(root, process.env.HILUM_DATA_DIR ?? '.data');
  const ports = {
    PORT: intFromEnv('PORT', 3000),
    HILUM_PG_PORT: intFromEnv('HILUM_PG_PORT', 54329),
    HILUM_S3_PORT: intFromEnv('HILUM_S3_PORT', 4569),
    HILUM_SMTP_PORT: intFromEnv('HILUM_SMTP_PORT', 2525),
  };
  if (dev) ports.HILUM_API_PORT = intFromEnv('HILUM_API_PORT', 3001);

  ensureWritableDir(dataDir, 'the data directory');
  const s3Dir = path.resolve(root, process.env.HILUM_S3_DIR ?? 'uploads');
  ensureWritableDir(s3Dir, 'the object-store directory', 'HILUM_S3_DIR');
  const outboxDir = path.join(dataDir, 'outbox');
  fs.mkdirSync(outboxDir, { recursive: true });

  // A cluster left running by a run that was killed is ours: stop it before checking ports.
  const existingBin = findPostgresBin();
  if (existingBin && fs.existsSync(path.join(dataDir, 'pg', 'postmaster.pid'))) {
    const runAs =
      process.getuid?.() === 0
        ? ['runuser', ['-u', 'postgres', '--', path.join(existingBin, 'pg_ctl')]]
        : [path.join(existingBin, 'pg_ctl'), []];
    spawnSync(runAs[0], [...runAs[1], 'stop', '-D', path.join(dataDir, 'pg'), '-m', 'fast', '-w'], {
      stdio: 'ignore',
    });
  }
  await assertPortsFree(ports);

  ensureDependencies();
  const bin = ensurePostgres();

  process.on('SIGINT', () => void stopAll(0));
  process.on('SIGTERM', () => void stopAll(0));

  const pg = await startPostgres({ bin, dataDir, port: ports.HILUM_PG_PORT });
  cleanups.push(() => pg.stop());
  const fakes = await startFakes({
    s3Port: ports.HILUM_S3_PORT,
    smtpPort: ports.HILUM_SMTP_PORT,
    s3Dir,
    outboxDir,
  });
  cleanups.push(() => stopChild(fakes.children.s3));
  cleanups.push(() => stopChild(fakes.children.smtp));

  const appPort = dev ? ports.HILUM_API_PORT : ports.PORT;
  const env = {
    ...process.env,
    ...fakes.env,
    NODE_ENV: process.env.NODE_ENV ?? 'development',
    DATABASE_URL: pg.url,
    HILUM_DATA_DIR: dataDir,
    PORT: String(appPort),
    HOST: '127.0.0.1',
    APP_ORIGIN: process.env.APP_ORIGIN ?? `http://127.0.0.1:${ports.PORT}`,
    // `npm start` keeps the terminal to warnings and errors (a line a request buries the address
    // and the sign-in); `npm run dev` logs every request. LOG_LEVEL overrides either.
    LOG_LEVEL: process.env.LOG_LEVEL ?? (dev ? 'info' : 'warn'),
    // This machine's Node is 20, which the object-store SDK warns about on every start (known; the
    // SDK's own switch for it). Production should run a current Node LTS instead.
    AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED:
      process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ?? 'true',
  };

  const prepare = spawnSync(
    process.execPath,
    ['--import', 'tsx', 'scripts/db-prepare.ts', ...(resetDemo ? ['--reset-demo'] : [])],
    {
      cwd: root,
      env,
      stdio: 'inherit',
    },
  );
  if (prepare.status !== 0) throw new SetupError('the database could not be prepared; see above');

  if (!dev) buildClientIfStale();

  const serverArgs = dev
    ? [
        path.join(root, 'node_modules', 'tsx', 'dist', 'cli.mjs'),
        'watch',
        '--clear-screen=false',
        'server/index.ts',
      ]
    : ['--import', 'tsx', 'server/index.ts'];
  // A crashed app server is started again (with backoff) while the other services keep running.
  const server = supervise(
    () =>
      spawn(process.execPath, serverArgs, {
        cwd: root,
        env: { ...env, STATIC_DIR: dev ? path.join(root, '.no-static') : path.join(root, 'dist') },
        stdio: ['ignore', 'inherit', 'inherit'],
      }),
    {
      say: (line) => process.stderr.write(`hilum: ${line}\n`),
      onGiveUp: () => void stopAll(1),
      stopping: () => stopping,
    },
  );
  cleanups.push(() => server.stop());

  if (dev) {
    const vite = spawn(
      path.join(root, 'node_modules', '.bin', 'vite'),
      ['--port', String(ports.PORT), '--strictPort', '--host', '127.0.0.1'],
      {
        cwd: root,
        env: { ...env, PORT: String(ports.PORT), HILUM_API_PORT: String(ports.HILUM_API_PORT) },
        stdio: ['ignore', 'inherit', 'inherit'],
      },
    );
    cleanups.push(() => stopChild(vite));
  }

  await waitForHealth(`http://127.0.0.1:${appPort}/api/health`);
  const url = `http://127.0.0.1:${ports.PORT}`;
  process.stdout.write(
    [
      '',
      `  Hilum is running at ${url}${dev ? ' (Vite dev server, API on port ' + appPort + ')' : ''}`,
      '  Demo sign-in: keeper@example.org (owner), grower@example.org and grower2@example.org',
      '                (growers), viewer@example.org (viewer) — password hilum-demo-seeds',
      `  Captured e-mail: ${url}/dev/mail (files in ${outboxDir})`,
      '  Press Ctrl-C to stop everything.',
      '',
    ].join('\n') + '\n',
  );
}

async function waitForHealth(url) {
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline && !stopping) {
    try {
      const res = await fetch(url);
      if (res.status === 200) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  if (!stopping) throw new SetupError(`the app did not become healthy at ${url}`);
}

main().catch(async (error) => {
  for (const cleanup of cleanups.reverse()) {
    try {
      await cleanup();
    } catch {
      // keep going
    }
  }
  fail(error);
});
