// The seeded coverage simulation of the viability model's 95% projection bands, shared by
// `npm run check:coverage` (scripts/check-coverage.ts) and the unit test that guards it. Lots are
// drawn from the model's own assumptions (server/stats/viability-model.ts MODEL_CONSTANTS), tested at
// random ages, fitted species by species as the app does; a band covers when it holds the true
// viability one year after the last test (today, for an untested lot).
import { normalCdf, normalQuantile } from '#server/stats/distributions';
import { temperatureFactor } from '#server/stats/storage-sigma';
import { fitSpeciesModel, MODEL_CONSTANTS, projectModel, type ModelLot } from '#server/stats/viability-model';
import { mulberry32 } from '../unit/stats/seeded-random';

export interface CoverageRow {
  group: string;
  lots: number;
  coveragePercent: number;
  medianWidth: number;
}

/** Storage: equivalent years per calendar year at 20, 5 and −18 °C against 15 °C, as the app scales them. */
const RATE_FACTORS = [20, 5, -18].map((t) => 1 / temperatureFactor(t, 15));
export const LOTS_PER_SPECIES = 8;

export function simulateCoverage(species: number, seed = 20261202): CoverageRow[] {
  const rand = mulberry32(seed);
  const gauss = () => {
    const u = Math.max(1e-12, rand());
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rand());
  };
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)]!;
  const binomial = (n: number, p: number) => {
    let k = 0;
    for (let i = 0; i < n; i++) if (rand() < p) k += 1;
    return k;
  };
  const c = MODEL_CONSTANTS;
  const outcomes: { group: string; basis: string; covered: boolean; width: number }[] = [];
  for (let s = 0; s < species; s++) {
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
      const nAssays = pick([0, 1, 1, 2, 2, 3, 5]);
      const assays = [];
      let age = 0.1 + rand() * 1.5;
      for (let i = 0; i < nAssays; i++) {
        const sown = pick([10, 20, 25, 50, 100, 200]);
        assays.push({
          id: `${s}-${j}-${i}`,
          age: age * rf,
          alive: binomial(sown, normalCdf(k - b * age * rf)),
          sown,
        });
        age += 0.4 + rand() * 2;
      }
      const target = (nAssays === 0 ? age : age + 1) * rf;
      const group =
        nAssays === 0
          ? 'untested'
          : nAssays === 1
            ? 'one test'
            : nAssays === 2
              ? 'two tests'
              : 'three or more tests';
      lots.push({ id: `${s}-${j}`, assays, k, b, rf, target, group });
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
      outcomes.push({
        group: lot.group,
        basis: r.model.basis,
        covered: truth >= band.low && truth <= band.high,
        width: band.high - band.low,
      });
    });
  }
  const summarise = (key: (o: (typeof outcomes)[number]) => string): CoverageRow[] => {
    const groups = new Map<string, (typeof outcomes)[number][]>();
    for (const o of outcomes) groups.set(key(o), [...(groups.get(key(o)) ?? []), o]);
    return [...groups].map(([name, os]) => ({
      group: name,
      lots: os.length,
      coveragePercent: (100 * os.filter((o) => o.covered).length) / os.length,
      medianWidth: [...os.map((o) => o.width)].sort((a, b) => a - b)[Math.floor(os.length / 2)]!,
    }));
  };
  return [
    ...summarise((o) => `tests: ${o.group}`),
    ...summarise((o) => `basis: ${o.basis}`),
    ...summarise(() => 'all lots'),
  ];
}
