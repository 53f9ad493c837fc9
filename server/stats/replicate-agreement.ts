import { homogeneityChiSquare } from './homogeneity';
import type { TrayCount } from './homogeneity';
import { maxToleratedRange } from './tolerated-range';

/**
 * How the trays' agreement is judged:
 * - 'tolerance-table': every tray has the same number of seeds, as the tolerance table assumes.
 *   The range between the highest and lowest tray percentage is compared with the maximum
 *   tolerated range (7 CFR 201.55 as printed for 2 or 4 trays of 100; the formula behind the
 *   table for other equal trays: tolerated-range.ts).
 * - 'chi-square': the trays differ in size. The range of percentages means little when a tray of
 *   10 seeds is set beside one of 190 (judged as two trays of 100, such trays were flagged in about
 *   37% of simulated tests of one lot where 2.5% is stated), so the trays are compared by Pearson's
 *   chi-square test of homogeneity (homogeneity.ts), which weighs each tray by its own size, at the
 *   table's probability of a false alarm.
 */
export type AgreementMethod = 'tolerance-table' | 'chi-square';

export interface Agreement {
  method: AgreementMethod;
  /** Maximum tolerated range (percentage points); null when the method is not a range rule. */
  maxRange: number | null;
  /** Highest minus lowest tray percentage (percentage points). */
  observedRange: number | null;
  ok: boolean | null;
  /** The chi-square test's p-value; null for the range rule. */
  pValue: number | null;
}

/** The probability of a false alarm: trays of one lot are called disagreeing this often (7 CFR 201.55). */
export const AGREEMENT_FALSE_ALARM = 0.025;

/**
 * The method for a test's trays: the tolerance table when every tray has the same number of seeds,
 * the chi-square test otherwise. Decide it from all the trays that will enter the figures (counted
 * or not yet), so it does not change while a test is counted.
 *
 * Why exactly equal: the table's ranges are worked out for replicates of one size; a chi-square
 * test is valid for equal trays too, so nothing is lost by using it whenever sizes differ at all.
 *
 * Measured false alarms (seeded simulation, tests/unit/stats/replicate-agreement.test.ts): within
 * 1.0–4.0% at a stated 2.5% for trays of 10 + 190, 20 + 80, 25 + 50 + 100 and 10 + 25 + 50 + 100
 * seeds at 50, 80 and 90% germination. Known limit: with very small trays and germination near 0
 * or 100% (e.g. 10 + 20 seeds at 95%) only a handful of outcomes are possible, and every
 * non-randomised test tried (chi-square, likelihood ratio, exact conditional, mid-p) then raises
 * far fewer alarms than 2.5% (under 1%): such a test seldom shows trays disagreeing.
 */
export function agreementMethod(seedsSown: readonly number[]): AgreementMethod {
  return seedsSown.every((n) => n === seedsSown[0]) ? 'tolerance-table' : 'chi-square';
}

/**
 * Whether the counted trays agree as trays of one lot should, by the given method.
 * `meanPercentRounded` is the pooled germination rounded to the whole percent (the table's row).
 * Fewer than two trays: every figure is null.
 */
export function replicateAgreement(
  trays: readonly TrayCount[],
  meanPercentRounded: number | null,
  method: AgreementMethod = agreementMethod(trays.map((t) => t.sown)),
): Agreement {
  if (trays.length < 2 || meanPercentRounded === null) {
    return { method, maxRange: null, observedRange: null, ok: null, pValue: null };
  }
  const percents = trays.map((t) => (100 * t.germinated) / t.sown);
  const observedRange = Math.max(...percents) - Math.min(...percents);
  if (method === 'tolerance-table') {
    const first = trays[0]?.sown ?? 0;
    if (trays.some((t) => t.sown !== first)) {
      throw new RangeError('the tolerance table needs trays of one size; use the chi-square method');
    }
    const maxRange = maxToleratedRange(meanPercentRounded, trays.length, first);
    return { method, maxRange, observedRange, ok: observedRange <= maxRange, pValue: null };
  }
  const { pValue } = homogeneityChiSquare(trays);
  return { method, maxRange: null, observedRange, ok: pValue >= AGREEMENT_FALSE_ALARM, pValue };
}
