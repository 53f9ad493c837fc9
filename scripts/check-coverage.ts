// `npm run check:coverage`: do the viability model's 95% projection bands cover the truth 95% of
// the time? Runs the seeded simulations in tests/helpers/coverage-simulation.ts and prints a table by
// group; `--json` prints it as JSON. Exits 1 when a group falls outside 93–97% (or has too few lots
// to tell). COVERAGE_SPECIES sets the number of simulated species (default 320, 8 lots each).
import {
  LOTS_PER_SPECIES,
  simulateCoverage,
  simulateWeakCoverage,
} from '../tests/helpers/coverage-simulation';

const SPECIES = Number(process.env.COVERAGE_SPECIES ?? 320);
const SEED = 20261202;
// Counted tests, then lots known only from weak evidence (trays sown by weight or guess, rough
// scores, sowings), each kind as its own group.
const rows = [
  ...simulateCoverage(SPECIES, SEED),
  ...simulateWeakCoverage(SPECIES, SEED + 1).filter((r) => r.group.startsWith('tests: weak')),
];
const MIN_LOTS = 200;
const ok = (r: (typeof rows)[number]) =>
  r.lots >= MIN_LOTS && r.coveragePercent >= 93 && r.coveragePercent <= 97;
const bad = rows.filter((r) => !ok(r));
if (process.argv.includes('--json')) {
  process.stdout.write(`${JSON.stringify({ seed: SEED, species: SPECIES, rows, ok: bad.length === 0 })}\n`);
} else {
  const lots = rows.find((r) => r.group === 'all lots')?.lots ?? 0;
  console.log(
    `95% projection bands, ${lots} simulated lots (${SPECIES} species × ${LOTS_PER_SPECIES}); target 93–97% per group`,
  );
  console.log('group                          lots  covered  median width');
  for (const r of rows) {
    console.log(
      `${r.group.padEnd(30)} ${String(r.lots).padStart(5)}  ${r.coveragePercent.toFixed(1).padStart(6)}%  ${r.medianWidth.toFixed(1).padStart(8)} pts${ok(r) ? '' : '  ✗'}`,
    );
  }
}
process.exitCode = bad.length === 0 ? 0 : 1;
