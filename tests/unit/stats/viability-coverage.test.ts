// The viability model's 95% projection bands are checked by seeded simulation, not by eye: lots drawn
// from the model's own assumptions, fitted as the app fits them (tests/helpers/coverage-simulation.ts;
// the full run with more lots is `npm run check:coverage`). Each group of lots — by number of tests
// and by how the rate is known — must see the truth inside its band 93–97% of the time.
import { describe, expect, it } from 'vitest';
import { simulateCoverage, simulateWeakCoverage } from '#tests/helpers/coverage-simulation';

describe('the viability bands, by seeded simulation', () => {
  it(
    'when 1,600 simulated lots are fitted, then every group’s 95% band covers the truth 93–97% of the time',
    { timeout: 120_000 },
    () => {
      const rows = simulateCoverage(200, 7);
      for (const row of rows) {
        expect(row.lots, row.group).toBeGreaterThanOrEqual(150);
        expect(row.coveragePercent, row.group).toBeGreaterThanOrEqual(93);
        expect(row.coveragePercent, row.group).toBeLessThanOrEqual(97);
      }
      expect(rows.map((r) => r.group)).toEqual(
        expect.arrayContaining([
          'tests: untested',
          'tests: one test',
          'tests: two tests',
          'tests: three or more tests',
          'basis: lot',
          'basis: species',
        ]),
      );
    },
  );

  it(
    'when 1,920 simulated lots have only weak evidence, then each kind’s 95% band covers the truth 93–97% of the time',
    { timeout: 240_000 },
    () => {
      // Trays sown by weight or guess, roughly scored trays, and what came up from sowings, each
      // drawn as the model assumes it arises (tests/helpers/coverage-simulation.ts).
      const rows = simulateWeakCoverage(240, 11);
      for (const row of rows.filter((r) => r.group.startsWith('tests: weak'))) {
        expect(row.lots, row.group).toBeGreaterThanOrEqual(450);
        expect(row.coveragePercent, row.group).toBeGreaterThanOrEqual(93);
        expect(row.coveragePercent, row.group).toBeLessThanOrEqual(97);
      }
      expect(rows.map((r) => r.group)).toEqual(
        expect.arrayContaining([
          'tests: weak: estimated tray',
          'tests: weak: scored tray',
          'tests: weak: sowing',
        ]),
      );
    },
  );
});
