import { sum } from 'simple-statistics';
import { chiSquareUpperTail } from './distributions';
import { assertPositiveCount, assertSuccesses } from './validate';

export interface TrayCount {
  germinated: number;
  sown: number;
}

export interface ChiSquareResult {
  statistic: number;
  df: number;
  pValue: number;
}

/**
 * Pearson chi-square test of homogeneity on the 2×k table (germinated / not germinated by tray),
 * without continuity correction: do the trays look like samples of one seed lot? df = k − 1.
 * When every seed germinated, or none did, the table carries no evidence of heterogeneity and the
 * result is statistic 0, p-value 1 (the expected counts of one row are all zero).
 */
export function homogeneityChiSquare(trays: readonly TrayCount[]): ChiSquareResult {
  if (trays.length === 0) throw new RangeError('at least one tray is needed');
  trays.forEach((t, i) => {
    assertPositiveCount(t.sown, `trays[${String(i)}].sown`);
    assertSuccesses(t.germinated, t.sown, `trays[${String(i)}].germinated`);
  });
  const df = trays.length - 1;
  const sown = trays.reduce((s, t) => s + t.sown, 0);
  const germinated = trays.reduce((s, t) => s + t.germinated, 0);
  if (df === 0 || germinated === 0 || germinated === sown) return { statistic: 0, df, pValue: 1 };
  const share = germinated / sown;
  // Σ (O − E)²/E over the 2k cells, added with simple-statistics' compensated (Kahan–Babuška) sum,
  // smallest first so the result does not depend on the order the trays are listed in.
  const cells = trays.flatMap((t) => {
    const expectedYes = t.sown * share;
    const expectedNo = t.sown - expectedYes;
    return [
      (t.germinated - expectedYes) ** 2 / expectedYes,
      (t.sown - t.germinated - expectedNo) ** 2 / expectedNo,
    ];
  });
  const statistic = sum(cells.sort((a, b) => a - b));
  return { statistic, df, pValue: chiSquareUpperTail(statistic, df) };
}
