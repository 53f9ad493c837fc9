// The ranking benchmark: a bank of 5,000 lots, 25,000 tests and 150,000 counts in a throwaway
// database (DATABASE_URL, made by scripts/bench.mjs), then the ranking endpoint timed against the
// raw SQL it issues, and against the floor: one bare select of the lots with their latest tests'
// stored results. Prints medians after warm-up; asserts nothing.
import { sql } from 'kysely';
import pg from 'pg';
import { hashPassword } from '../server/auth/password';
import { loadConfig } from '../server/config';
import { createDb } from '../server/db/database';
import { migrateToLatest } from '../server/db/migrate';
import { refreshStaleResults } from '../server/modules/germination/assay-results';
import { syncReferenceSpecies } from '../server/modules/species/reference-sync';
import { createViabilityService } from '../server/modules/viability/viability.service';
import { serveApp, signIn, timeMedian as time } from './lib/bench';
import { reportFigures } from './lib/bench-figures';

const LOTS = 5_000;
const ASSAYS_PER_LOT = 5;
const TRAYS_PER_ASSAY = 2;
const CHECKS_PER_TRAY = 3;
const ON = '2027-03-01';

const config = loadConfig();
let capture: { sql: string; parameters: readonly unknown[] }[] | null = null;
const db = createDb(config.databaseUrl, 10, (text, parameters) => capture?.push({ sql: text, parameters }));

async function seed(): Promise<{ bankId: string; email: string; password: string }> {
  await migrateToLatest(db);
  await syncReferenceSpecies(db);
  const email = 'bench@example.org';
  const password = 'bench-password-123';
  const user = await db
    .insertInto('users')
    .values({ email, name: 'Bench', password_hash: await hashPassword(password) })
    .returning('id')
    .executeTakeFirstOrThrow();
  const bank = await db
    .insertInto('banks')
    .values({ name: 'Bench bank' })
    .returning('id')
    .executeTakeFirstOrThrow();
  await db.insertInto('memberships').values({ bank_id: bank.id, user_id: user.id, role: 'owner' }).execute();
  const b = bank.id;
  // Invented benchmark data: viability falls along a probit line per species, with noise.
  await sql`
    insert into lots (bank_id, species_id, code, variety, origin, harvest_date, storage_place)
    select ${b}, s.id, 'B-' || lpad(g::text, 5, '0'), 'Bench ' || g, 'saved',
      date '2016-09-01' + ((g * 37) % 3000), (array['room','fridge','freezer'])[1 + g % 3]
    from generate_series(1, ${LOTS}) g
    join lateral (select id from species where bank_id is null order by ref_key offset (g % 32) limit 1) s on true`.execute(
    db,
  );
  await sql`insert into stock_movements (lot_id, kind, change, date, reason)
    select id, 'initial', 2000, harvest_date, 'bench' from lots where bank_id = ${b}`.execute(db);
  await sql`
    insert into germination_tests (bank_id, lot_id, start_date, method, status, finished_on)
    select ${b}, l.id, l.harvest_date + 120 + k * 200, 'paper towel', 'finished', l.harvest_date + 134 + k * 200
    from lots l, generate_series(0, ${ASSAYS_PER_LOT - 1}) k where l.bank_id = ${b}`.execute(db);
  await sql`insert into test_trays (test_id, position, seeds_sown)
    select t.id, p, 50 from germination_tests t, generate_series(1, ${TRAYS_PER_ASSAY}) p where t.bank_id = ${b}`.execute(
    db,
  );
  await sql`
    insert into tray_counts (tray_id, check_date, cumulative)
    select tr.id, t.start_date + c * 4,
      least(50, floor(50 * greatest(0.02, 0.95 - 0.12 * ((t.start_date - l.harvest_date) / 365.25) - ((abs(hashtext(tr.id::text)) % 10) / 100.0)) * c / ${CHECKS_PER_TRAY}))::int
    from test_trays tr
    join germination_tests t on t.id = tr.test_id
    join lots l on l.id = t.lot_id,
    generate_series(1, ${CHECKS_PER_TRAY}) c
    where t.bank_id = ${b}`.execute(db);
  await sql`update test_trays tr set ungerminated = 50 - coalesce((select max(cumulative) from tray_counts c where c.tray_id = tr.id), 0), abnormal = 0`.execute(
    db,
  );
  await sql`analyze`.execute(db);
  return { bankId: b, email, password };
}

/** The columns of a test's stored result (germination module, assay-results.ts). */
const RESULT_COLUMNS = [
  'result',
  'result_sown',
  'result_germinated',
  'result_percent',
  'result_mean_days',
  'result_last_count_date',
  'result_version',
];

const { bankId, email, password } = await seed();
const counts = await sql<{ lots: number; tests: number; counts: number }>`
  select (select count(*) from lots where bank_id = ${bankId})::int as lots,
         (select count(*) from germination_tests where bank_id = ${bankId})::int as tests,
         (select count(*) from tray_counts c join test_trays tr on tr.id = c.tray_id join germination_tests t on t.id = tr.test_id
           where t.bank_id = ${bankId})::int as counts`.execute(db);
console.log(`data: ${JSON.stringify(counts.rows[0])}`);
// The seeding wrote tests with raw SQL, past the services that store each test's result: compute
// them all, as the app does at start for tests stored under an older definition.
const t0 = performance.now();
const refreshed = await refreshStaleResults(db);
console.log(
  `stored results: ${refreshed} tests computed in ${((performance.now() - t0) / 1000).toFixed(1)} s`,
);
await sql`analyze germination_tests`.execute(db);

const app = await serveApp(config, db);
const cookie = await signIn(app.base, email, password);

/**
 * One ranking request, timed to its last byte: parsing 5,000 items into objects is the client's
 * work (a browser's, on another machine), so the timed call only reads the body.
 */
const request = async () => {
  const res = await fetch(`${app.base}/api/banks/${bankId}/ranking?on=${ON}`, { headers: { cookie } });
  if (res.status !== 200) throw new Error(`ranking answered ${res.status}`);
  return res.arrayBuffer();
};
const endpoint = async () => JSON.parse(Buffer.from(await request()).toString('utf8')) as unknown;

// The SQL the endpoint issues, captured once and replayed straight through pg.
// The first request after a start fits every species; later ones find the fits current.
const tCold = performance.now();
await request();
console.log(`first ranking after start (every species fitted): ${(performance.now() - tCold).toFixed(0)} ms`);
capture = [];
const body = (await endpoint()) as { items: unknown[] };
const issued = capture;
capture = null;
const raw = new pg.Client({ connectionString: config.databaseUrl });
await raw.connect();
const rawSql = async () => {
  for (const q of issued) await raw.query(q.sql, q.parameters as unknown[]);
};
const service = createViabilityService({ db });

for (const q of issued) {
  const t = await time(3, () => raw.query(q.sql, q.parameters as unknown[]));
  console.log(`  query ${t.toFixed(0).padStart(4)} ms  ${q.sql.replace(/\s+/g, ' ').slice(0, 90)}…`);
}

// The floor: every lot of the bank with its latest test's stored result, one bare select.
const latestResults = `
  select l.id, l.code, s.common_name, t.id as test_id, t.start_date, t.status, ${RESULT_COLUMNS.map((c) => `t.${c}`).join(', ')}
  from lots l
  join species s on s.id = l.species_id
  left join lateral (
    select * from germination_tests t where t.lot_id = l.id order by t.start_date desc, t.created_at desc limit 1
  ) t on true
  where l.bank_id = $1`;
const bareSelect = async () => (await raw.query(latestResults, [bankId])).rows.length;

const RUNS = 7;
const tRaw = await time(RUNS, rawSql);
const tService = await time(RUNS, () => service.ranking(bankId, ON));
const tEndpoint = await time(RUNS, request);
const tFloor = await time(RUNS, bareSelect);
console.log(
  `ranking of ${body.items.length} lots (${((await request()).byteLength / 1e6).toFixed(1)} MB of JSON); the endpoint issues ${issued.length} queries (${issued.filter((q) => /^select/i.test(q.sql.trim())).length} selects)`,
);
console.log(`raw SQL through pg:                 ${tRaw.toFixed(0)} ms (median of ${RUNS})`);
console.log(`service in-process (SQL + fits):    ${tService.toFixed(0)} ms`);
console.log(`  of which model fits and decisions: ~${Math.max(0, tService - tRaw).toFixed(0)} ms`);
console.log(`endpoint over HTTP (JSON, schema):  ${tEndpoint.toFixed(0)} ms (target ≤ 150 ms)`);
console.log(
  `bare select of lots + latest results: ${tFloor.toFixed(0)} ms (${(await bareSelect()).toLocaleString('en')} rows; the floor)`,
);
console.log(`ratio endpoint / (raw SQL + fits):  ${(tEndpoint / tService).toFixed(2)}`);
console.log(`ratio endpoint / raw SQL alone:     ${(tEndpoint / tRaw).toFixed(2)}`);
reportFigures({
  rankingLots: body.items.length,
  rankingHttpMedianMs: Math.round(tEndpoint * 10) / 10,
  rankingRawSelectMedianMs: Math.round(tFloor * 10) / 10,
});

await raw.end();
await app.close();
await db.destroy();
