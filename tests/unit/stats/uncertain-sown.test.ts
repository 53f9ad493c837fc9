import { describe, expect, it } from 'vitest';
import {
  germinationFromUncertainSown,
  seedsFromGrams,
  sownFromGuess,
  wilsonInterval,
} from '#server/stats/index';
import type { UncertainSownGermination } from '#server/stats/index';
import { binomialDraw, mulberry32, normalDraw } from './seeded-random';
import { simulateTray, type LotScenario } from './sown-simulation';

function estimate(result: UncertainSownGermination) {
  if (result.kind !== 'estimate') throw new Error(`expected an estimate, got ${result.kind}`);
  return result;
}

describe('germination from an uncertain number sown', () => {
  it('when the count is known exactly, then the result is the Wilson interval itself', () => {
    for (const [x, n] of [
      [0, 20],
      [7, 20],
      [20, 20],
      [88, 100],
    ] as const) {
      const r = estimate(germinationFromUncertainSown(x, { mean: n, sd: 0 }));
      expect(r.interval).toEqual(wilsonInterval(x, n));
      expect(r.fraction).toBe(x / n);
      expect(r.seedsSownEstimated).toBe(false);
      // The closed form meets Wilson's as the spread of the count shrinks to nothing.
      const nearly = estimate(germinationFromUncertainSown(x, { mean: n, sd: 1e-7 }));
      expect(nearly.interval.low).toBeCloseTo(r.interval.low, 9);
      expect(nearly.interval.high).toBeCloseTo(r.interval.high, 9);
    }
  });

  it('when the number sown is uncertain, then the interval contains the counted tray’s and is wider', () => {
    const counted = estimate(germinationFromUncertainSown(60, { mean: 80, sd: 0 }));
    const weighed = estimate(germinationFromUncertainSown(60, { mean: 80, sd: 8 }));
    expect(weighed.seedsSownEstimated).toBe(true);
    expect(weighed.fraction).toBe(counted.fraction);
    expect(weighed.interval.low).toBeLessThan(counted.interval.low);
    expect(weighed.interval.high).toBeGreaterThan(counted.interval.high);
  });

  it('when the bound is checked by hand, then it solves the widened score equation', () => {
    // (x − μp)² = z²(μp(1 − p) + τ²p²) at both ends (the documented method).
    const z = 1.959963984540054;
    const [x, mu, tau] = [45, 70, 9];
    const r = estimate(germinationFromUncertainSown(x, { mean: mu, sd: tau }));
    for (const p of [r.interval.low, r.interval.high]) {
      expect((x - mu * p) ** 2).toBeCloseTo(z * z * (mu * p * (1 - p) + tau * tau * p * p), 8);
    }
  });

  it('when more seedlings come up than could plausibly have been sown, then no percentage is given', () => {
    const r = germinationFromUncertainSown(130, { mean: 90, sd: 10 });
    expect(r.kind).toBe('more-seedlings-than-sown');
    if (r.kind === 'more-seedlings-than-sown') expect(r.plausibleMaxSown).toBeCloseTo(90 + 1.959964 * 10, 4);
    // A counted tray with more seedlings than seeds says the same instead of >100%.
    expect(germinationFromUncertainSown(21, { mean: 20, sd: 0 }).kind).toBe('more-seedlings-than-sown');
  });

  it('when a few more seedlings than the estimate come up, then the estimate is capped at 100%', () => {
    const r = estimate(germinationFromUncertainSown(95, { mean: 90, sd: 10 }));
    expect(r.fraction).toBe(1);
    expect(r.capped).toBe(true);
    expect(r.interval.high).toBe(1);
    expect(r.interval.low).toBeLessThan(1);
  });

  it('when only a pinch was guessed, then the interval is wide and runs to 100%', () => {
    const r = estimate(germinationFromUncertainSown(8, sownFromGuess('pinch')));
    expect(r.interval.high).toBe(1);
    expect(r.interval.low).toBeGreaterThan(0);
    expect(r.interval.low).toBeLessThan(0.25);
  });
});

// Seeded simulation of a grower's lot: seeds of varying weight (and chaff particles), 100-seed
// samples weighed on a 0.01 g scale, a purity sample cleaned by hand, a tray sprinkled by weight,
// and seedlings drawn from the tray's true seeds. The propagated 95% interval should cover the true
// germination 95% of the time where the spread is estimated from the rules' 8 replicates, and at
// least that often (by design, cautiously) with fewer.
const RULES_SCENARIOS: LotScenario[] = [
  {
    name: 'small clean seed',
    seedGrams: 0.0011,
    seedCv: 0.2,
    purity: 1,
    replicates: 8,
    trayGrams: 0.1,
    p: 0.8,
    puritySampleGrams: 1,
  },
  {
    name: 'clean seed, middling',
    seedGrams: 0.003,
    seedCv: 0.25,
    purity: 1,
    replicates: 8,
    trayGrams: 0.4,
    p: 0.6,
    puritySampleGrams: 1,
  },
  {
    name: 'chaffy, good',
    seedGrams: 0.002,
    seedCv: 0.3,
    purity: 0.7,
    replicates: 8,
    trayGrams: 0.3,
    p: 0.85,
    puritySampleGrams: 1,
  },
  {
    name: 'chaffy, poor',
    seedGrams: 0.004,
    seedCv: 0.3,
    purity: 0.5,
    replicates: 8,
    trayGrams: 0.5,
    p: 0.3,
    puritySampleGrams: 2,
  },
  {
    name: 'small tray',
    seedGrams: 0.003,
    seedCv: 0.25,
    purity: 1,
    replicates: 8,
    trayGrams: 0.1,
    p: 0.7,
    puritySampleGrams: 1,
  },
  {
    name: 'large chaffy seed',
    seedGrams: 0.025,
    seedCv: 0.2,
    purity: 0.85,
    replicates: 8,
    trayGrams: 2.5,
    p: 0.9,
    puritySampleGrams: 10,
  },
];
const FEW_SCENARIOS: LotScenario[] = [
  {
    name: 'one sample',
    seedGrams: 0.0011,
    seedCv: 0.2,
    purity: 1,
    replicates: 1,
    trayGrams: 0.1,
    p: 0.8,
    puritySampleGrams: 1,
  },
  {
    name: 'three samples, chaffy',
    seedGrams: 0.002,
    seedCv: 0.45,
    purity: 0.7,
    replicates: 3,
    trayGrams: 0.3,
    p: 0.5,
    puritySampleGrams: 1,
  },
];
const TRIALS = 1000;

function run(scenario: LotScenario, seed: number) {
  const uniform = mulberry32(seed);
  let covered = 0;
  let contained = 0; // the counted tray's interval lies inside the propagated one
  let width = 0;
  let countedWidth = 0;
  for (let i = 0; i < TRIALS; i++) {
    const tray = simulateTray(scenario, uniform);
    const r = germinationFromUncertainSown(tray.seedlings, tray.estimate);
    const counted = germinationFromUncertainSown(tray.seedlings, { mean: tray.estimate.mean, sd: 0 });
    if (r.kind !== 'estimate') continue;
    if (r.interval.low <= scenario.p && scenario.p <= r.interval.high) covered++;
    width += r.interval.high - r.interval.low;
    if (counted.kind !== 'estimate') {
      contained++; // the counted reading calls it impossible; the propagated one does not
      continue;
    }
    countedWidth += counted.interval.high - counted.interval.low;
    if (r.interval.low <= counted.interval.low && counted.interval.high <= r.interval.high) contained++;
  }
  return { coverage: (100 * covered) / TRIALS, contained, width, countedWidth };
}

describe('seeded simulation of trays sown by weight', () => {
  it('when the lot’s seed weight comes from 8 replicates, then the 95% interval covers 95% ± 1.5 points overall', () => {
    const results = RULES_SCENARIOS.map((s, i) => ({ name: s.name, ...run(s, 1000 + i) }));
    const pooled = results.reduce((sum, r) => sum + r.coverage, 0) / results.length;
    expect(pooled).toBeGreaterThanOrEqual(93.5);
    expect(pooled).toBeLessThanOrEqual(96.5);
    for (const r of results) {
      // 1000 trials give a Monte Carlo SE of about 0.7 points; each scenario within 3.5 SE.
      expect(r.coverage, r.name).toBeGreaterThanOrEqual(92.5);
      expect(r.coverage, r.name).toBeLessThanOrEqual(97.5);
      // Wider than the counted tray's interval with the same numbers: it always contains it, and is
      // wider on average (the two meet only where both are clipped at 0% or 100%).
      expect(r.contained, r.name).toBe(TRIALS);
      expect(r.width, r.name).toBeGreaterThan(r.countedWidth * 1.05);
    }
  });

  it('when fewer samples were weighed, then the interval is cautious: it covers at least as often as claimed', () => {
    for (const [i, s] of FEW_SCENARIOS.entries()) {
      const r = run(s, 2000 + i);
      expect(r.coverage, s.name).toBeGreaterThanOrEqual(95 - 1.5);
    }
  });

  it('when the species’ figure stands in and the lot truly sits anywhere in its range, then coverage holds too', () => {
    // The lot's real seeds per gram drawn log-normally around the species' figure with the stated
    // spread (our convention), clean seed, trays of about 0.3 g, germination 70%.
    const uniform = mulberry32(3000);
    const typical = 390;
    const s = Math.sqrt(Math.log1p(0.35 ** 2));
    let covered = 0;
    for (let i = 0; i < TRIALS; i++) {
      const truePerGram = typical * Math.exp(s * normalDraw(uniform) - (s * s) / 2);
      const grams = 0.3;
      const seeds = Math.round(grams * truePerGram);
      const x = binomialDraw(uniform, seeds, 0.7);
      const r = germinationFromUncertainSown(
        x,
        seedsFromGrams(grams, { species: { seedsPerGram: typical } }),
      );
      if (r.kind === 'estimate' && r.interval.low <= 0.7 && 0.7 <= r.interval.high) covered++;
    }
    expect((100 * covered) / TRIALS).toBeGreaterThanOrEqual(95 - 1.5);
  });
});
