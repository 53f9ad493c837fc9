// The lot-list benchmark: the demo bank (about 40 lots) in a throwaway database (DATABASE_URL, made
// by scripts/bench.mjs), its lot list requested over HTTP by a signed-in member at concurrency 20,
// against a bare Express route serving the very bytes of that response, in the same process and run.
// Load comes from autocannon in a child process, to 127.0.0.1 only. Prints requests/s; asserts nothing.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import express from 'express';
import { sql } from 'kysely';
import { systemClock } from '../server/clock';
import { loadConfig } from '../server/config';
import { createDb } from '../server/db/database';
import { createDemoSeason } from '../server/demo/demo-scenario';
import { migrateToLatest } from '../server/db/migrate';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../server/demo/demo-people';
import { syncReferenceSpecies } from '../server/modules/species/reference-sync';
import { listenLocal, median, serveApp, signIn } from './lib/bench';
import { reportFigures } from './lib/bench-figures';

const CONNECTIONS = 20;
const WARM_UP_S = 1;
const MEASURE_S = 3;
const ROUNDS = 3;

const config = loadConfig();
const db = createDb(config.databaseUrl);
await migrateToLatest(db);
await syncReferenceSpecies(db);
const seeded = await createDemoSeason({ db, clock: systemClock, appOrigin: config.appOrigin });
if (!seeded) throw new Error('the demo bank was already there; the benchmark needs a fresh database');
const { bankId } = seeded;
// The demo stores packet photos for its first twelve lots; without an object store here, their
// rows are written directly so the list's thumbnails are looked up as in the demo.
await sql`
  insert into photos (id, bank_id, subject, subject_id, full_key, thumb_key, width, height, bytes)
  select gen_random_uuid(), bank_id, 'lot', id, 'bench/' || id || '.jpg', 'bench/' || id || '-thumb.jpg', 900, 1200, 120000
  from (select bank_id, id from lots where bank_id = ${bankId} order by created_at limit 12) l`.execute(db);
await sql`analyze`.execute(db);

const app = await serveApp(config, db);
const owner = DEMO_ACCOUNTS.find((a) => a.role === 'owner')!;
const cookie = await signIn(app.base, owner.email, DEMO_PASSWORD);
const listUrl = `${app.base}/api/banks/${bankId}/lots?limit=50`;
const real = await fetch(listUrl, { headers: { cookie } });
const body = await real.text();
if (real.status !== 200) throw new Error(`the lot list answered ${real.status}`);
const lots = (JSON.parse(body) as { items: unknown[] }).items.length;

// The same JSON from a bare Express app: one route, nothing else, sent as res.json sends it.
const bare = express();
bare.get('/lots', (_req, res) => {
  res.type('json').send(body);
});
const bareServer = bare.listen(0, '127.0.0.1');
const bareUrl = `${await listenLocal(bareServer)}/lots`;

const autocannonCli = path.resolve('node_modules/autocannon/autocannon.js');

/**
 * CPU seconds spent so far by PostgreSQL's server processes (Linux /proc, clock ticks of 10 ms),
 * when scripts/bench.mjs names the cluster's postmaster.pid; null elsewhere.
 */
function postgresCpuSeconds(): number | null {
  const pidFile = process.env.HILUM_BENCH_PG_PIDFILE;
  if (!pidFile || !fs.existsSync(pidFile) || !fs.existsSync('/proc/self/stat')) return null;
  const postmaster = Number(fs.readFileSync(pidFile, 'utf8').split('\n')[0]);
  let ticks = 0;
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = fs.readFileSync(`/proc/${entry}/stat`, 'utf8');
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      // Fields after the name: state, ppid, …, utime (14th of the line), stime (15th).
      if (Number(entry) === postmaster || Number(fields[1]) === postmaster)
        ticks += Number(fields[11]) + Number(fields[12]);
    } catch {
      // The process ended while being read.
    }
  }
  return ticks / 100;
}

interface Run {
  rate: number;
  /** CPU microseconds per request: this process (the app and the bare route), and PostgreSQL. */
  appCpuUs: number;
  pgCpuUs: number | null;
}

/** Requests/s that autocannon reaches against `url` in `seconds`; any non-2xx answer is an error. */
function load(url: string, seconds: number): Promise<Run> {
  return new Promise((resolve, reject) => {
    const child = spawn(
      process.execPath,
      [
        autocannonCli,
        '--json',
        '-c',
        String(CONNECTIONS),
        '-d',
        String(seconds),
        '-H',
        `cookie: ${cookie}`,
        url,
      ],
      { stdio: ['ignore', 'pipe', 'pipe'] },
    );
    const cpu0 = process.cpuUsage();
    const pg0 = postgresCpuSeconds();
    let out = '';
    let err = '';
    child.stdout.on('data', (chunk: Buffer) => (out += chunk.toString()));
    child.stderr.on('data', (chunk: Buffer) => (err += chunk.toString()));
    child.once('error', reject);
    child.once('exit', (code) => {
      const cpu = process.cpuUsage(cpu0);
      const pg1 = postgresCpuSeconds();
      if (code !== 0) return reject(new Error(`autocannon exited with ${code}: ${err.trim()}`));
      const result = JSON.parse(out.trim().split('\n').pop()!) as {
        requests: { average: number; total: number };
        non2xx: number;
        errors: number;
        timeouts: number;
      };
      if (result.non2xx || result.errors || result.timeouts) {
        return reject(
          new Error(
            `${url}: ${result.non2xx} non-2xx answers, ${result.errors} errors, ${result.timeouts} timeouts`,
          ),
        );
      }
      const n = Math.max(1, result.requests.total);
      resolve({
        rate: result.requests.average,
        appCpuUs: (cpu.user + cpu.system) / n,
        pgCpuUs: pg0 === null || pg1 === null ? null : ((pg1 - pg0) * 1e6) / n,
      });
    });
  });
}

await load(listUrl, WARM_UP_S);
await load(bareUrl, WARM_UP_S);
const listRuns: Run[] = [];
const bareRuns: Run[] = [];
for (let round = 0; round < ROUNDS; round++) {
  listRuns.push(await load(listUrl, MEASURE_S));
  bareRuns.push(await load(bareUrl, MEASURE_S));
}
const listRates = listRuns.map((r) => r.rate);
const bareRates = bareRuns.map((r) => r.rate);
const listRate = median(listRates);
const bareRate = median(bareRates);
/** Median CPU per request of the runs, in words. */
const cpuWords = (runs: Run[]) => {
  const app = `${median(runs.map((r) => r.appCpuUs)).toFixed(0)} µs in Node`;
  const pgUs = runs.every((r) => r.pgCpuUs !== null) ? median(runs.map((r) => r.pgCpuUs!)) : null;
  return pgUs === null ? app : `${app} + ${pgUs.toFixed(0)} µs in PostgreSQL`;
};
const kb = (Buffer.byteLength(body) / 1024).toFixed(1);
console.log(
  `lot list of the demo bank (${lots} lots, ${kb} KB), concurrency ${CONNECTIONS}, median of ${ROUNDS} runs of ${MEASURE_S} s each:`,
);
console.log(
  `  signed-in lot list:            ${listRate.toFixed(0)} requests/s (${listRates.map((r) => r.toFixed(0)).join(', ')})`,
);
console.log(
  `  bare Express, same bytes:      ${bareRate.toFixed(0)} requests/s (${bareRates.map((r) => r.toFixed(0)).join(', ')})`,
);
console.log(`  ratio:                         ${((100 * listRate) / bareRate).toFixed(0)}% (target ≥ 50%)`);
console.log(`  CPU per request, lot list:     ${cpuWords(listRuns)}`);
console.log(`  CPU per request, bare route:   ${cpuWords(bareRuns)}`);
reportFigures({ lotListReqPerSec: Math.round(listRate), bareExpressReqPerSec: Math.round(bareRate) });

bareServer.closeAllConnections();
await new Promise((resolve) => bareServer.close(resolve));
await app.close();
await db.destroy();
