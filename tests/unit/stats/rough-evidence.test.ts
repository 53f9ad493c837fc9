import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import {
  FIELD_ESTABLISHMENT,
  ROUGH_SCORE_BANDS,
  emergenceLogLikelihood,
  roughScoreCounts,
  roughScoreLikelihood,
} from '#server/stats/index';
import type { RoughScore } from '#server/stats/index';

const SCORES: RoughScore[] = ['none', 'few', 'half', 'most'];

describe('a rough score of seedlings', () => {
  it('when the bands are read, then they are our documented convention and meet without gaps', () => {
    expect(ROUGH_SCORE_BANDS).toEqual({
      none: { low: 0, high: 0.05 },
      few: { low: 0.05, high: 0.35 },
      half: { low: 0.35, high: 0.65 },
      most: { low: 0.65, high: 1 },
    });
  });

  it('when a tray of 20 is scored, then every count belongs to exactly one score', () => {
    // 5% of 20 = 1, 35% = 7, 65% = 13 [computed]: none 0; few 1–6; half 7–12; most 13–20.
    expect(roughScoreCounts('none', 20)).toEqual({ low: 0, high: 0 });
    expect(roughScoreCounts('few', 20)).toEqual({ low: 1, high: 6 });
    expect(roughScoreCounts('half', 20)).toEqual({ low: 7, high: 12 });
    expect(roughScoreCounts('most', 20)).toEqual({ low: 13, high: 20 });
    for (const p of [0, 0.03, 0.2, 0.5, 0.77, 1]) {
      const total = SCORES.reduce((sum, s) => sum + roughScoreLikelihood(s, p, 20), 0);
      expect(total).toBeCloseTo(1, 12);
    }
  });

  it('when the likelihood is compared with a reference library, then it is the binomial band probability', () => {
    // P(7 ≤ X ≤ 12), X ~ Binomial(20, 0.45), summed from jStat 1.9.6's binomial pdf.
    let expected = 0;
    for (let k = 7; k <= 12; k++) expected += jStat.binomial.pdf(k, 20, 0.45);
    expect(roughScoreLikelihood('half', 0.45, 20)).toBeCloseTo(expected, 12);
  });

  it('when "most" came up, then high germination is far likelier than low, but no percentage is claimed', () => {
    expect(roughScoreLikelihood('most', 0.9, 30)).toBeGreaterThan(0.99);
    expect(roughScoreLikelihood('most', 0.3, 30)).toBeLessThan(1e-4);
    // Inside the band the likelihood is nearly flat: 75% and 95% are told apart far less than a
    // count would tell them apart.
    const ratio = roughScoreLikelihood('most', 0.95, 30) / roughScoreLikelihood('most', 0.75, 30);
    expect(ratio).toBeLessThan(1.2);
  });
});

describe('seedlings that came up from a real sowing', () => {
  const logLik = (seedlings: number, p: number) => emergenceLogLikelihood({ seedlings }, 40, p);

  it('when 30 of 40 came up, then germination below 75% becomes unlikely and up to 100% stays plausible', () => {
    // Emergence = germination × establishment, establishment 60–100% (our convention), so 30/40
    // emerged says the lot germinates at least about that well; 100% is as plausible as 80%.
    expect(logLik(30, 1) - logLik(30, 0.8)).toBeGreaterThan(-1);
    expect(logLik(30, 0.5) - logLik(30, 0.8)).toBeLessThan(-4);
  });

  it('when compared with the same counts from a test, then emergence is weaker evidence', () => {
    // A counted test's binomial log-likelihood (constants dropped) for 30 of 40.
    const test = (p: number) => 30 * Math.log(p) + 10 * Math.log(1 - p);
    // Both peak near 75–100%, but a test rules out 95% sharply and emergence does not.
    expect(test(0.95) - test(0.75)).toBeLessThan(-5);
    expect(logLik(30, 0.95) - logLik(30, 0.75)).toBeGreaterThan(-1);
  });

  it('when only a score is recorded, then it enters through the same establishment range', () => {
    const none = (p: number) => emergenceLogLikelihood({ score: 'none' }, 40, p);
    expect(none(0.02)).toBeGreaterThan(none(0.5));
    expect(FIELD_ESTABLISHMENT.low).toBeLessThan(FIELD_ESTABLISHMENT.high);
  });

  it('when more seedlings are counted than seeds recorded, then the sowing is taken to hold at least that many', () => {
    expect(Number.isFinite(emergenceLogLikelihood({ seedlings: 45 }, 40, 0.9))).toBe(true);
  });
});
