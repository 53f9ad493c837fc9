import type { z } from 'zod';
import type { basisSchema, RecommendationValue } from '#shared/schemas/viability';

export type Basis = z.infer<typeof basisSchema>;

export const recommendationLabels: Record<RecommendationValue, string> = {
  sow: 'Sow',
  'sow-thick': 'Sow thick',
  'grow-out': 'Grow out',
  retest: 'Retest',
  'test-first': 'Test first',
  retire: 'Retire',
};
/**
 * Best first: the order the recommendation column sorts in and the advice filter lists. Lots to
 * sow come first (grow-out is sown this year too, for fresh seed), then lots waiting on a test (a
 * retest has a figure already, a first test has none), then lots to put away.
 */
export const recommendationOrder: readonly RecommendationValue[] = [
  'sow',
  'sow-thick',
  'grow-out',
  'retest',
  'test-first',
  'retire',
];

export const basisWords: Record<Basis, string> = {
  lot: 'fitted to this lot’s tests',
  species: 'slope borrowed from this bank’s other lots of the species',
  typical: 'from the species’ typical seed life',
};

/** Why the retest date falls where it does (the server's rule names, in words). */
export const retestReasonWords: Record<string, string> = {
  'lower-bound': 'That is when the low end of the likely range reaches the germination the lot should keep.',
  'monitoring-interval':
    'That is a third of the way to the age at which germination is expected to fall to 85% of its start (a genebank monitoring rule).',
  'one-year-cap': 'That is a year after the last test, the longest Hilum waits between tests.',
};

/** A percentage for the screen: whole numbers, as seed-testing rules report germination. */
export const pct = (value: number) => `${Math.round(value)}%`;

const oneDecimal = new Intl.NumberFormat('en', { minimumFractionDigits: 1, maximumFractionDigits: 1 });
export const years = (value: number) => `${oneDecimal.format(value)} yr`;
export const days = (value: number) => `${oneDecimal.format(value)} d`;

const count = new Intl.NumberFormat('en');
export const formatCount = (n: number) => count.format(n);

const wholeOrOneDecimal = new Intl.NumberFormat('en', { maximumFractionDigits: 1 });

/** A span of time in a grower's words: "about 8 months", "about 3.5 years", "about 24 years". */
export function spanWords(yearsAhead: number): string {
  if (yearsAhead < 1) {
    const months = Math.max(1, Math.round(yearsAhead * 12));
    return `about ${months} ${months === 1 ? 'month' : 'months'}`;
  }
  const shown =
    yearsAhead < 10
      ? wholeOrOneDecimal.format(Math.round(yearsAhead * 2) / 2)
      : String(Math.round(yearsAhead));
  return `about ${shown} ${shown === '1' ? 'year' : 'years'}`;
}

/**
 * One line of the storage advice: how long until the lot's projection falls to the threshold.
 * The server answers 0 when it is already at or under it, and null when it stays above for 100 years.
 */
export function keepsWords(yearsToThreshold: number | null, threshold: number): string {
  if (yearsToThreshold === null) return `more than 100 years before it falls to ${pct(threshold)}`;
  if (yearsToThreshold <= 0) return `already at or below ${pct(threshold)}`;
  return `${spanWords(yearsToThreshold)} until it falls to ${pct(threshold)}`;
}
