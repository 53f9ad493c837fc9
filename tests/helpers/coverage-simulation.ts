// The seeded coverage simulation of the viability model's 95% projection bands, shared by
// `npm run check:coverage` (scripts/check-coverage.ts) and the unit test that guards it. Lots are
// drawn from the model's own assumptions (server/stats/viability-model.ts MODEL_CONSTANTS), tested at
// random ages, fitted species by species as the app does; a band covers when it holds the true
// viability one year after the last test (today, for an untested lot).
import { normalCdf, normalQuantile } from '#server/stats/distributions';
import { temperatureFactor } from '#server/stats/storage-sigma';
import { roughScoreCounts, ROUGH_SCORE_BANDS, type RoughScore } from '#server/stats/rough-evidence';
import { seedsFromGrams, sownFromGuess } from '#server/stats/sown-estimate';
import {
  fitSpeciesModel,
  MODEL_CONSTANTS,
  projectModel,
  type ModelAssay,
  type ModelLot,
} from '#server/stats/viability-model';
import { FIELD_ESTABLISHMENT } from '#server/stats/rough-evidence';
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

/** Draws used by an evidence maker. */
interface Draws {
  rand: () => number;
  gauss: () => number;
  pick: <T>(xs: readonly T[]) => T;
  binomial: (n: number, p: number) => number;
}

/**
 * How one lot's evidence at an age is drawn from its true germination p: a counted test by default;
 * the weak-evidence simulation draws trays sown by weight or guess, rough scores and sowings.
 * Returns the evidence and its group name.
 */
type EvidenceMaker = (d: Draws, id: string, age: number, p: number) => ModelAssay;

const countedTest: EvidenceMaker = (d, id, age, p) => {
  const sown = d.pick([10, 20, 25, 50, 100, 200]);
  return { id, age, alive: d.binomial(sown, p), sown };
};

export function simulateCoverage(species: number, seed = 20261202): CoverageRow[] {
  return simulate(species, seed, countedTest, () => null);
}

/** The tray's score: which band its share of seedlings falls in (rough-evidence.ts). */
function scoreOf(seedlings: number, sown: number): RoughScore {
  for (const score of Object.keys(ROUGH_SCORE_BANDS) as RoughScore[]) {
    const { low, high } = roughScoreCounts(score, sown);
    if (seedlings >= low && seedlings <= high) return score;
  }
  throw new Error(`no band holds ${seedlings} of ${sown}`);
}

/** A true number sown around an estimate: log-normal with the estimate's mean and SD, whole, ≥ 1. */
function trueSown(d: Draws, mean: number, sd: number): number {
  const s2 = Math.log1p((sd / mean) ** 2);
  return Math.max(1, Math.round(Math.exp(Math.log(mean) - s2 / 2 + Math.sqrt(s2) * d.gauss())));
}

/** Weak evidence, each kind drawn as the model assumes it arises. */
const WEAK_KINDS = ['estimated tray', 'scored tray', 'sowing'] as const;
type WeakKind = (typeof WEAK_KINDS)[number];

function weakEvidence(kind: WeakKind): EvidenceMaker {
  return (d, id, age, p) => {
    if (kind === 'estimated tray') {
      // Sown by weight on the species' typical seeds per gram (basis species), or by a guess.
      const est =
        d.rand() < 0.5
          ? seedsFromGrams(d.pick([0.05, 0.1, 0.2, 0.5]), {
              species: { seedsPerGram: d.pick([100, 300, 800]) },
            })
          : sownFromGuess(d.pick(['pinch', 'few-dozen', 'hundreds'] as const));
      const n = trueSown(d, est.mean, est.sd);
      return {
        id,
        age,
        alive: d.binomial(n, p),
        sown: est.mean,
        evidence: { kind: 'estimated', sownSd: est.sd },
      };
    }
    if (kind === 'scored tray') {
      const sown = d.pick([20, 50, 100, 200]);
      return {
        id,
        age,
        alive: 0,
        sown,
        evidence: { kind: 'score', score: scoreOf(d.binomial(sown, p), sown) },
      };
    }
    // A real sowing: each germinating seed also emerges with an establishment share drawn from
    // FIELD_ESTABLISHMENT (the model's own assumption); counted, or scored one time in three.
    const sown = d.pick([20, 40, 100]);
    const share = FIELD_ESTABLISHMENT.low + d.rand() * (FIELD_ESTABLISHMENT.high - FIELD_ESTABLISHMENT.low);
    const seedlings = d.binomial(sown, p * share);
    return {
      id,
      age,
      alive: 0,
      sown,
      evidence: {
        kind: 'emergence',
        emergence: d.rand() < 1 / 3 ? { score: scoreOf(seedlings, sown) } : { seedlings },
      },
    };
  };
}

/**
 * The same simulation with weak evidence: every lot has one to three pieces of one kind (trays sown
 * by weight or guess, roughly scored trays, or what came up from sowings), drawn as the model assumes.
 * Grouped by kind, so each kind's bands are checked on their own.
 */
export function simulateWeakCoverage(species: number, seed = 20261203): CoverageRow[] {
  return simulate(
    species,
    seed,
    (d, id, age, p) => weakEvidence(WEAK_KINDS[Number(id.split('-')[1]) % WEAK_KINDS.length]!)(d, id, age, p),
    (lotIndex) => `weak: ${WEAK_KINDS[lotIndex % WEAK_KINDS.length]!}`,
    [1, 1, 2, 3],
  );
}

function simulate(
  species: number,
  seed: number,
  makeEvidence: EvidenceMaker,
  groupOf: (lotIndex: number) => string | null,
  assayCounts: readonly number[] = [0, 1, 1, 2, 2, 3, 5],
): CoverageRow[] {
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
  const draws: Draws = { rand, gauss, pick, binomial };
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
      const nAssays = pick(assayCounts);
      const assays: ModelAssay[] = [];
      let age = 0.1 + rand() * 1.5;
      for (let i = 0; i < nAssays; i++) {
        assays.push(makeEvidence(draws, `${s}-${j}-${i}`, age * rf, normalCdf(k - b * age * rf)));
        age += 0.4 + rand() * 2;
      }
      const target = (nAssays === 0 ? age : age + 1) * rf;
      const group =
        groupOf(j) ??
        (nAssays === 0
          ? 'untested'
          : nAssays === 1
            ? 'one test'
            : nAssays === 2
              ? 'two tests'
              : 'three or more tests');
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
