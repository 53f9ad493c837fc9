import { normalRangeQuantile } from './normal-range';
import { assertFinite, assertPercent } from './validate';

/**
 * Maximum tolerated range between replicates at 2.5% probability, 7 CFR 201.55 (the same values
 * as the ISTA Rules' table), indexed by the whole-percent mean (50–99; for a mean below 50 the
 * table is read at 100 − mean). Rows for means 51–70 with four replicates are from memory (marked
 * [memory] in REFERENCES.md) and await confirmation against the printed table.
 */
const FOUR_REPLICATES_OF_100: ReadonlyArray<readonly [minMean: number, maxMean: number, range: number]> = [
  [99, 99, 5],
  [98, 98, 6],
  [97, 97, 7],
  [96, 96, 8],
  [95, 95, 9],
  [93, 94, 10],
  [91, 92, 11],
  [90, 90, 12],
  [89, 89, 12],
  [88, 88, 13],
  [87, 87, 13],
  [84, 86, 14],
  [81, 83, 15],
  [78, 80, 16],
  [76, 77, 17],
  [73, 75, 17],
  [71, 72, 18],
  [67, 70, 18], // from memory
  [56, 66, 19], // from memory
  [51, 55, 20], // from memory
];

/** 7 CFR 201.55, two replicates of 100 seeds; printed for means 71–97 only. */
const TWO_REPLICATES_OF_100: ReadonlyArray<readonly [minMean: number, maxMean: number, range: number]> = [
  [97, 97, 6],
  [96, 96, 6],
  [95, 95, 7],
  [93, 94, 8],
  [91, 92, 9],
  [90, 90, 9],
  [89, 89, 10],
  [88, 88, 10],
  [87, 87, 11],
  [84, 86, 11],
  [81, 83, 12],
  [78, 80, 13],
  [76, 77, 13],
  [73, 75, 14],
  [71, 72, 14],
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
 * Maximum tolerated range (percentage points) between the highest and lowest replicate of a
 * germination test, at 2.5% probability.
 *
 * The mean is first rounded to the whole percent, as the rules report it, and a mean below 50 is
 * read at 100 − mean. A mean that rounds to 100 (or 0) is read at 99, the table's last row: a
 * range of zero would be unattainable for a mean of, say, 99.75.
 *
 * Method: for 4 or 2 replicates of exactly 100 seeds the printed table (7 CFR 201.55 / ISTA)
 * is the authority wherever it has a row; every other design — and the table's blank rows — use
 * computedToleratedRange (normal approximation, numeric range distribution).
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
  const folded = Math.min(99, Math.max(rounded, 100 - rounded));
  if (seedsPerReplicate === 100) {
    const table =
      replicates === 4 ? FOUR_REPLICATES_OF_100 : replicates === 2 ? TWO_REPLICATES_OF_100 : undefined;
    const printed = table === undefined ? undefined : lookUp(table, folded);
    if (printed !== undefined) return printed;
  }
  return computedToleratedRange(folded, replicates, seedsPerReplicate);
}
