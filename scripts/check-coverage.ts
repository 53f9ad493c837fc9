// `npm run check:coverage`: do the viability model's 95% projection bands cover the truth 95% of
// the time? A seeded simulation draws species and lots from the model's own assumptions
// (server/stats/viability-model.ts MODEL_CONSTANTS), tests them at random ages, fits each species
// as the app does, and counts how often the band one year after the last test (or today, for an
// untested lot) holds the true viability. Prints a table by group; `--json` prints it as JSON.
// Exits 1 when a group falls outside 93–97% (or has too few lots to tell).
import { normalCdf, normalQuantile } from '../server/stats/distributions';
import { fitSpeciesModel, MODEL_CONSTANTS, projectModel, type ModelLot } from '../server/stats/viability-model';
import { mulberry32 } from '../tests/unit/stats/seeded-random';

const SPECIES = Number(process.env.COVERAGE_SPECIES ?? 320);
const LOTS_PER_SPECIES = 8;
const rand = mulberry32(20261202);
const gauss = () => {
  const u = Math.max(1e-12, rand());
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rand());
};
const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)]!;
function binomial(n: number, p: number): number {
  let k = 0;
  for (let i = 0; i < n; i++) if (rand() < p) k += 1;
  return k;
}

const c = MODEL_CONSTANTS;
/** Storage: equivalent years per calendar year (room, fridge, freezer; temperature terms as the app). */
const RATE_FACTORS = [1.77, 0.37, 0.092];

interface Outcome {
  group: string;
  basis: string;
  covered: boolean;
  width: number;
}
const outcomes: Outcome[] = [];

for (let s = 0; s < SPECIES; s++) {
  const life = pick([1, 2, 4, 6, null]);
  const m0 = Math.log(normalQuantile(c.typicalInitial) / (life ?? c.unknownLifeYears));
  const omega = life ? c.omega : c.omegaUnknown;
  const mu = m0 + omega * gauss();
  const lots: (ModelLot & { k: number; b: number; rf: number; target: number; group: string })[] = [];
  for (let j = 0; j < LOTS_PER_SPECIES; j++) {
    let k: number;
    do k = c.muK + c.sK * gauss();
    while (k < c.kMin || k > c.kMax);
    const b = Math.exp(mu + c.tau * gauss());
    const rf = pick(RATE_FACTORS);
    const nTests = pick([0, 1, 1, 2, 2, 3, 5]);
    const tests = [];
    let age = 0.1 + rand() * 1.5;
    for (let i = 0; i < nTests; i++) {
      const sown = pick([10, 20, 25, 50, 100, 200]);
      tests.push({ id: `${s}-${j}-${i}`, age: age * rf, alive: binomial(sown, normalCdf(k - b * age * rf)), sown });
      age += 0.4 + rand() * 2;
    }
    const target = (nTests === 0 ? age : age + 1) * rf;
    const group = nTests === 0 ? 'untested' : nTests === 1 ? 'one test' : nTests === 2 ? 'two tests' : 'three or more tests';
    lots.push({ id: `${s}-${j}`, tests, k, b, rf, target, group });
  }
  const fits = fitSpeciesModel(lots, { typicalLifeYears: life });
  fits.forEach((r, j) => {
    const lot = lots[j]!;
    if (!r.ok) {
      outcomes.push({ group: lot.group, basis: 'failed', covered: false, width: 100 });
      return;
    }
    const band = projectModel(r.model, lot.target);
    const truth = 100 * normalCdf(lot.k - lot.b * lot.target);
    outcomes.push({ group: lot.group, basis: r.model.basis, covered: truth >= band.low && truth <= band.high, width: band.high - band.low });
  });
}

function summarise(key: (o: Outcome) => string) {
  const groups = new Map<string, Outcome[]>();
  for (const o of outcomes) groups.set(key(o), [...(groups.get(key(o)) ?? []), o]);
  return [...groups].map(([name, os]) => ({
    group: name,
    lots: os.length,
    coveragePercent: (100 * os.filter((o) => o.covered).length) / os.length,
    medianWidth: [...os.map((o) => o.width)].sort((a, b) => a - b)[Math.floor(os.length / 2)]!,
  }));
}
const rows = [...summarise((o) => `tests: ${o.group}`), ...summarise((o) => `basis: ${o.basis}`), ...summarise(() => 'all lots')];
const MIN_LOTS = 200;
const bad = rows.filter((r) => r.lots < MIN_LOTS || r.coveragePercent < 93 || r.coveragePercent > 97);
if (process.argv.includes('--json')) {
  process.stdout.write(`${JSON.stringify({ seed: 20261202, species: SPECIES, rows, ok: bad.length === 0 })}\n`);
} else {
  console.log(`95% projection bands, ${outcomes.length} simulated lots (${SPECIES} species × ${LOTS_PER_SPECIES}); target 93–97% per group`);
  console.log('group                          lots  covered  median width');
  for (const r of rows) {
    console.log(`${r.group.padEnd(30)} ${String(r.lots).padStart(5)}  ${r.coveragePercent.toFixed(1).padStart(6)}%  ${r.medianWidth.toFixed(1).padStart(8)} pts${r.lots >= MIN_LOTS && r.coveragePercent >= 93 && r.coveragePercent <= 97 ? '' : '  ✗'}`);
  }
}
process.exitCode = bad.length === 0 ? 0 : 1;
