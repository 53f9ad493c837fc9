// A physical simulation of a home grower's lot, sample weighings and a tray sown by weight, used by
// the coverage tests of the propagated germination interval.
import { seedWeightFromSamples, purityFromSample, seedsFromGrams } from '#server/stats/index';
import type { SownEstimate } from '#server/stats/index';
import { binomialDraw, normalDraw } from './seeded-random';

export interface LotScenario {
  name: string;
  /** Mean weight of one seed, grams. */
  seedGrams: number;
  /** CV of one seed's weight. */
  seedCv: number;
  /** Pure-seed fraction by weight of the material (1 = clean seed). */
  purity: number;
  /** 100-seed samples the grower weighs. */
  replicates: number;
  /** Grams of material sprinkled on the tray. */
  trayGrams: number;
  /** True germination fraction. */
  p: number;
  /** Grams of material in the purity sample. */
  puritySampleGrams: number;
}

const STEP = 0.01;
const roundToScale = (grams: number) => Math.max(STEP, Math.round(grams / STEP) * STEP);

/** Draws particles (seeds and chaff) of the lot's material. */
function material(s: LotScenario, uniform: () => number) {
  const sigma = Math.sqrt(Math.log1p(s.seedCv * s.seedCv));
  const seedWeight = () => s.seedGrams * Math.exp(sigma * normalDraw(uniform) - (sigma * sigma) / 2);
  // Chaff particles weigh half a seed on average with CV 1 (log-normal); the share of particles that
  // are seeds is set so that seeds make up `purity` of the weight.
  const chaffMean = s.seedGrams / 2;
  const chaffSigma = Math.sqrt(Math.log(2));
  const chaffWeight = () =>
    chaffMean * Math.exp(chaffSigma * normalDraw(uniform) - (chaffSigma * chaffSigma) / 2);
  const seedShare = s.purity / (s.purity + (1 - s.purity) * (s.seedGrams / chaffMean));
  const particle = (): { seed: boolean; grams: number } =>
    s.purity >= 1 || uniform() < seedShare
      ? { seed: true, grams: seedWeight() }
      : { seed: false, grams: chaffWeight() };
  /** Material taken until its weight reaches `grams`: the seeds in it and their weight. */
  const take = (grams: number) => {
    let total = 0;
    let seeds = 0;
    let seedGrams = 0;
    while (total < grams) {
      const q = particle();
      total += q.grams;
      if (q.seed) {
        seeds++;
        seedGrams += q.grams;
      }
    }
    return { total, seeds, seedGrams };
  };
  return { seedWeight, take };
}

export interface SimulatedTray {
  seedlings: number;
  seedsSown: number;
  estimate: SownEstimate;
}

/** One lot's weighings and one tray sown by weight, as a grower would record them. */
export function simulateTray(s: LotScenario, uniform: () => number): SimulatedTray {
  const m = material(s, uniform);
  const samples = [];
  for (let r = 0; r < s.replicates; r++) {
    let grams = 0;
    for (let i = 0; i < 100; i++) grams += m.seedWeight();
    samples.push({ seeds: 100, grams: roundToScale(grams) });
  }
  const seedWeight = seedWeightFromSamples(samples, { chaffy: s.purity < 1 });
  let purity = null;
  if (s.purity < 1) {
    const sample = m.take(s.puritySampleGrams);
    purity = purityFromSample(roundToScale(sample.total), roundToScale(sample.seedGrams), {
      seedsPerGram: seedWeight.seedsPerGram,
    });
  }
  // The grower adds seed until the scale shows the tray's grams: the true weight is anywhere within
  // that display step.
  const tray = m.take(s.trayGrams + (uniform() - 0.5) * STEP);
  const estimate = seedsFromGrams(roundToScale(tray.total), { lot: seedWeight, purity });
  return { seedlings: binomialDraw(uniform, tray.seeds, s.p), seedsSown: tray.seeds, estimate };
}
