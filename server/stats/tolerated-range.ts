import { normalRangeQuantile } from './normal-range';
import { assertFinite, assertPercent } from './validate';

/**
 * Maximum tolerated range between replicates at 2.5% probability, 7 CFR 201.55 (the same values
 * as the ISTA Rules' table), indexed by the table's row: the whole-percent means 51–99. The printed
 * table pairs each of these rows with a mean below 51 — 99 with 2, 98 with 3, … 71 with 30 — so a
 * mean m of 50 or less reads the row 101 − m (see tableRow). Rows 71–99 were read in 7 CFR 201.55
 * as printed; rows 51–70 for four replicates are from memory (marked [memory] in REFERENCES.md)
 * and await confirmation against the printed table.
 */
const FOUR_REPLICATES_OF_100: ReadonlyArray<readonly [minMean: number, maxMean: number, range: number]> = [
  [99, 99, 5], // means 99 and 2: 7 CFR 201.55 as printed
  [98, 98, 6], // means 98 and 3: 7 CFR 201.55 as printed
  [97, 97, 7], // means 97 and 4: 7 CFR 201.55 as printed
  [96, 96, 8], // means 96 and 5: 7 CFR 201.55 as printed
  [95, 95, 9], // means 95 and 6: 7 CFR 201.55 as printed
  [93, 94, 10], // means 93–94 and 7–8: 7 CFR 201.55 as printed
  [91, 92, 11], // means 91–92 and 9–10: 7 CFR 201.55 as printed
  [90, 90, 12], // means 90 and 11: 7 CFR 201.55 as printed
  [89, 89, 12], // means 89 and 12: 7 CFR 201.55 as printed
  [88, 88, 13], // means 88 and 13: 7 CFR 201.55 as printed
  [87, 87, 13], // means 87 and 14: 7 CFR 201.55 as printed
  [84, 86, 14], // means 84–86 and 15–17: 7 CFR 201.55 as printed
  [81, 83, 15], // means 81–83 and 18–20: 7 CFR 201.55 as printed
  [78, 80, 16], // means 78–80 and 21–23: 7 CFR 201.55 as printed
  [76, 77, 17], // means 76–77 and 24–25: 7 CFR 201.55 as printed
  [73, 75, 17], // means 73–75 and 26–28: 7 CFR 201.55 as printed
  [71, 72, 18], // means 71–72 and 29–30: 7 CFR 201.55 as printed
  [67, 70, 18], // means 67–70 and 31–34: from memory [memory], 7 CFR 201.55
  [56, 66, 19], // means 56–66 and 35–45: from memory [memory], 7 CFR 201.55
  [51, 55, 20], // means 51–55 and 46–50: from memory [memory], 7 CFR 201.55
];

/** 7 CFR 201.55 as printed, two replicates of 100 seeds; printed for rows 71–97 only. */
const TWO_REPLICATES_OF_100: ReadonlyArray<readonly [minMean: number, maxMean: number, range: number]> = [
  [97, 97, 6], // means 97 and 4: 7 CFR 201.55 as printed
  [96, 96, 6], // means 96 and 5: 7 CFR 201.55 as printed
  [95, 95, 7], // means 95 and 6: 7 CFR 201.55 as printed
  [93, 94, 8], // means 93–94 and 7–8: 7 CFR 201.55 as printed
  [91, 92, 9], // means 91–92 and 9–10: 7 CFR 201.55 as printed
  [90, 90, 9], // means 90 and 11: 7 CFR 201.55 as printed
  [89, 89, 10], // means 89 and 12: 7 CFR 201.55 as printed
  [88, 88, 10], // means 88 and 13: 7 CFR 201.55 as printed
  [87, 87, 11], // means 87 and 14: 7 CFR 201.55 as printed
  [84, 86, 11], // means 84–86 and 15–17: 7 CFR 201.55 as printed
  [81, 83, 12], // means 81–83 and 18–20: 7 CFR 201.55 as printed
  [78, 80, 13], // means 78–80 and 21–23: 7 CFR 201.55 as printed
  [76, 77, 13], // means 76–77 and 24–25: 7 CFR 201.55 as printed
  [73, 75, 14], // means 73–75 and 26–28: 7 CFR 201.55 as printed
  [71, 72, 14], // means 71–72 and 29–30: 7 CFR 201.55 as printed
];

function lookUp(table: ReadonlyArray<readonly [number, number, number]>, mean: number): number | undefined {
  return table.find(([min, max]) => mean >= min && mean <= max)?.[2];
}

/** Probability of exceeding the tolerated range, as in the published tables. */
const TAIL_PROBABILITY = 0.025;

/**
 * Tolerated range by the normal approximation to the binomial (Miles 1963, as described by
 * da Silva 2020): S = q·√(p(100 − p)/n) percentage points, where q is the 97.5% quantile of the
 * range of k independent standard normals (computed by numeric integration in normal-range.ts).
 * Not rounded: the printed table rounds, and not every printed row follows from rounding this.
 */
export function computedToleratedRange(
  meanPercent: number,
  replicates: number,
  seedsPerReplicate: number,
): number {
  const sd = Math.sqrt((meanPercent * (100 - meanPercent)) / seedsPerReplicate);
  return normalRangeQuantile(replicates, 1 - TAIL_PROBABILITY) * sd;
}

/**
 * The printed table's row for a whole-percent mean: the mean itself from 51 to 99, and 101 − mean
 * from 2 to 50 (the table pairs 99 with 2, 98 with 3, … 71 with 30, 51 with 50; 7 CFR 201.55 as
 * printed). The table has no row for 100, 1 or 0: those read the row 99 (Hilum's choice — a
 * tolerated range of zero would be unattainable for a mean of, say, 99.75).
 */
export function tableRow(wholePercent: number): number {
  const row = wholePercent >= 51 ? wholePercent : 101 - wholePercent;
  return Math.min(99, row);
}

/**
 * Maximum tolerated range (percentage points) between the highest and lowest replicate of a
 * germination test, at 2.5% probability. It assumes replicates of one size, as the table does;
 * for trays of different sizes use a test made for them (replicate-agreement.ts).
 *
 * The mean is first rounded to the whole percent, as the rules report it.
 *
 * Method: for 4 or 2 replicates of exactly 100 seeds the printed table (7 CFR 201.55 / ISTA) is
 * the authority wherever it has a row, read at tableRow(mean). Every other design — and the
 * table's blank rows — uses computedToleratedRange at the rounded mean itself (the formula is
 * symmetric in p and 100 − p, so it needs no pairing of rows), kept within 1–99 so a mean of 0 or
 * 100 still allows some spread.
 */
export function maxToleratedRange(meanPercent: number, replicates = 4, seedsPerReplicate = 100): number {
  assertPercent(meanPercent, 'meanPercent');
  if (!Number.isInteger(replicates) || replicates < 2) {
    throw new RangeError(`replicates must be a whole number ≥ 2 (got ${String(replicates)})`);
  }
  assertFinite(seedsPerReplicate, 'seedsPerReplicate');
  if (seedsPerReplicate <= 0) {
    throw new RangeError(`seedsPerReplicate must be positive (got ${String(seedsPerReplicate)})`);
  }
  const rounded = Math.round(meanPercent);
  if (seedsPerReplicate === 100) {
    const table =
      replicates === 4 ? FOUR_REPLICATES_OF_100 : replicates === 2 ? TWO_REPLICATES_OF_100 : undefined;
    const printed = table === undefined ? undefined : lookUp(table, tableRow(rounded));
    if (printed !== undefined) return printed;
  }
  return computedToleratedRange(Math.min(99, Math.max(1, rounded)), replicates, seedsPerReplicate);
}
