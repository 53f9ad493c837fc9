import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import {
  AGREEMENT_FALSE_ALARM,
  agreementMethod,
  homogeneityChiSquare,
  maxToleratedRange,
  replicateAgreement,
  summarizeTest,
} from '#server/stats/index';
import type { AgreementMethod, TrayCount } from '#server/stats/index';
import { mulberry32 } from './seeded-random';

// Do the trays of one test agree as trays of one lot should? For trays of one size Hilum uses the
// tolerance table (7 CFR 201.55: a range exceeded by chance in 2.5% of tests); for trays of
// different sizes, Pearson's chi-square test of homogeneity at the same 2.5%. The false-alarm rate
// — how often trays of ONE lot are called disagreeing — is checked here by seeded simulation.

/** Draws a binomial count by inverting its cdf (probabilities from jstat), one uniform per tray. */
function binomialSampler(n: number, p: number): (u: number) => number {
  const cdf: number[] = [];
  let total = 0;
  for (let x = 0; x <= n; x++) cdf.push((total += jStat.binomial.pdf(x, n, p)));
  return (u) => {
    const x = cdf.findIndex((c) => u < c);
    return x === -1 ? n : x;
  };
}

/** Share of simulated tests of one lot (germination p) whose trays are called disagreeing. */
function falseAlarmRate(
  sizes: readonly number[],
  p: number,
  runs: number,
  seed: number,
  judge: (trays: TrayCount[]) => boolean | null = (trays) => {
    const germinated = trays.reduce((s, t) => s + t.germinated, 0);
    const sown = trays.reduce((s, t) => s + t.sown, 0);
    return replicateAgreement(trays, Math.floor((200 * germinated + sown) / (2 * sown))).ok;
  },
): number {
  const uniform = mulberry32(seed);
  const samplers = sizes.map((n) => binomialSampler(n, p));
  let alarms = 0;
  for (let run = 0; run < runs; run++) {
    const trays = sizes.map((sown, i) => ({ sown, germinated: samplers[i]?.(uniform()) ?? 0 }));
    if (judge(trays) === false) alarms += 1;
  }
  return alarms / runs;
}

// 20 000 simulated tests per design and rate: the binomial standard error of a 2.5% rate is then
// 0.11 points, so the ±1.5-point band (1.0–4.0%) is about 13 standard errors wide.
const RUNS = 20_000;
const RATES = [0.5, 0.8, 0.9] as const;
// Trays of different sizes (chi-square), and trays of one size to show the table's path stays right.
const DESIGNS: readonly { sizes: readonly number[]; method: AgreementMethod }[] = [
  { sizes: [10, 190], method: 'chi-square' },
  { sizes: [20, 80], method: 'chi-square' },
  { sizes: [25, 50, 100], method: 'chi-square' },
  { sizes: [10, 25, 50, 100], method: 'chi-square' },
  { sizes: [100, 100, 100, 100], method: 'tolerance-table' },
  { sizes: [50, 50], method: 'tolerance-table' },
];
const CASES = DESIGNS.flatMap(({ sizes, method }, d) =>
  RATES.map((p, r) => ({
    design: sizes.join(' + '),
    percent: 100 * p,
    sizes,
    method,
    p,
    seed: 1000 + 10 * d + r,
  })),
);

describe('replicateAgreement false alarms (seeded simulation)', () => {
  it.each(CASES)(
    'when trays of $design seeds of one lot germinate at $percent per cent, then $method calls 1.0–4.0 per cent of tests disagreeing (stated 2.5)',
    ({ sizes, method, p, seed }) => {
      expect(agreementMethod(sizes)).toBe(method);
      const rate = falseAlarmRate(sizes, p, RUNS, seed);
      expect(rate).toBeGreaterThanOrEqual(0.01);
      expect(rate).toBeLessThanOrEqual(0.04);
    },
  );

  it('when trays of 10 and 190 were judged by the table as two trays of their mean size, then false alarms were far above 2.5%', () => {
    // Why unequal trays need their own method: the old rule (range against the table at the mean
    // tray size) flagged a third of tests of one lot at 90%.
    const oldRule = (trays: TrayCount[]) => {
      const percents = trays.map((t) => (100 * t.germinated) / t.sown);
      const mean = (100 * trays.reduce((s, t) => s + t.germinated, 0)) / 200;
      return Math.max(...percents) - Math.min(...percents) <= maxToleratedRange(mean, 2, 100);
    };
    expect(falseAlarmRate([10, 190], 0.9, 5_000, 77, oldRule)).toBeGreaterThan(0.2);
  });

  it('when trays are tiny and germination near 100%, then false alarms fall below 1% (a known limit, not hidden)', () => {
    // Discreteness: trays of 10 and 20 at 95% leave a handful of likely outcomes, and none of the
    // non-randomised tests tried (chi-square, likelihood ratio, exact conditional, mid-p) reaches
    // 1% there (by exact enumeration: 0.45%, 0.47%, 0.04%, 0.45%). Such a test seldom calls trays
    // disagreeing; the limit is documented beside agreementMethod (server/stats/replicate-agreement.ts).
    expect(falseAlarmRate([10, 20], 0.95, RUNS, 4242)).toBeLessThan(0.01);
  });
});

describe('replicateAgreement', () => {
  it('when every tray has the same number of seeds, then the tolerance table judges them; otherwise chi-square', () => {
    expect(agreementMethod([100, 100, 100, 100])).toBe('tolerance-table');
    expect(agreementMethod([25, 25])).toBe('tolerance-table');
    expect(agreementMethod([100, 99])).toBe('chi-square');
    expect(agreementMethod([10, 25, 50, 100])).toBe('chi-square');
  });

  it('when four trays of 100 are within the table, then it gives the printed range and no p-value', () => {
    const trays = [95, 90, 88, 87].map((germinated) => ({ germinated, sown: 100 }));
    // Mean 90 → 12 (7 CFR 201.55 as printed); observed 95 − 87 = 8.
    expect(replicateAgreement(trays, 90)).toEqual({
      method: 'tolerance-table',
      maxRange: 12,
      observedRange: 8,
      ok: true,
      pValue: null,
    });
  });

  it('when trays differ in size, then the p-value is the chi-square test of homogeneity (checked with jstat)', () => {
    // 171/190 and 9/10: pooled 180/200 = 0.9. Pearson statistic by the binomial dispersion form
    // Σ (xᵢ − nᵢp̄)² / (nᵢ p̄ (1 − p̄)) = 0 + 0 (both trays at 90%): p = 1.
    expect(
      replicateAgreement(
        [
          { germinated: 171, sown: 190 },
          { germinated: 9, sown: 10 },
        ],
        90,
      ),
    ).toEqual({
      method: 'chi-square',
      maxRange: null,
      observedRange: 0,
      ok: true,
      pValue: 1,
    });
    // 171/190 and 3/10: p̄ = 174/200 = 0.87; statistic by the dispersion form, upper tail from jstat's χ²₁.
    const trays = [
      { germinated: 171, sown: 190 },
      { germinated: 3, sown: 10 },
    ];
    const pbar = 0.87;
    const statistic = trays.reduce(
      (s, t) => s + (t.germinated - t.sown * pbar) ** 2 / (t.sown * pbar * (1 - pbar)),
      0,
    );
    const result = replicateAgreement(trays, 87);
    expect(result.pValue).toBeCloseTo(1 - jStat.chisquare.cdf(statistic, 1), 10);
    expect(result.pValue).toBe(homogeneityChiSquare(trays).pValue);
    expect(result.ok).toBe(false);
    expect(result.observedRange).toBeCloseTo(60, 10);
    expect(AGREEMENT_FALSE_ALARM).toBe(0.025); // 7 CFR 201.55: the table's 2.5% probability
  });

  it('when fewer than two trays are counted, then there is nothing to judge', () => {
    expect(replicateAgreement([{ germinated: 9, sown: 10 }], 90, 'chi-square')).toEqual({
      method: 'chi-square',
      maxRange: null,
      observedRange: null,
      ok: null,
      pValue: null,
    });
  });

  it('when summarizeTest judges trays of different sizes, then its agreement is this one', () => {
    const summary = summarizeTest([
      { id: 'a', seedsSown: 10, checks: [{ day: 7, cumulative: 3 }] },
      { id: 'b', seedsSown: 190, checks: [{ day: 7, cumulative: 171 }] },
    ]);
    expect(summary.agreement).toEqual(
      replicateAgreement(
        [
          { germinated: 3, sown: 10 },
          { germinated: 171, sown: 190 },
        ],
        87,
      ),
    );
    expect(summary.agreement.method).toBe('chi-square');
  });
});
