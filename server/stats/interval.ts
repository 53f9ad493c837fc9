/** A two-sided confidence interval for a proportion, as fractions 0–1. */
export interface Interval {
  low: number;
  high: number;
}
