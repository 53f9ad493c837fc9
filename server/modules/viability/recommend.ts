import { dayInWords } from '../../../shared/day-words';

export type Recommendation = 'sow' | 'sow-thick' | 'retest' | 'retire';

export interface DecisionInput {
  seedsOnHand: number;
  /** Projected germination on the sowing date, percent, with its interval; null without a fit. */
  projected: { percent: number; low: number; high: number } | null;
  hasTest: boolean;
  noFitReason: string | null;
  retestBy: string | null;
  on: string;
  /** The species' published minimum germination where there is one, else the bank's threshold. */
  threshold: number;
  thresholdIsStandard: boolean;
  establishment: number;
}

/** Below this projected upper bound a lot is not worth the tray space (Hilum's rule). */
export const RETIRE_BELOW_PERCENT = 30;
/** An interval wider than this many points says too little: test again (Hilum's rule). */
export const MAX_INTERVAL_WIDTH = 30;

const pct = (v: number) => `${Math.round(v)}%`;

/** Hilum's recommendation for one lot, with its reason in words. */
export function decide(input: DecisionInput): { recommendation: Recommendation; reason: string } {
  const { projected } = input;
  if (input.seedsOnHand <= 0) return { recommendation: 'retire', reason: 'No seeds left in the ledger.' };
  if (projected && projected.high < RETIRE_BELOW_PERCENT) {
    return {
      recommendation: 'retire',
      reason: `Projected at ${pct(projected.percent)} (at best ${pct(projected.high)}) on ${dayInWords(input.on)}: too few would come up to be worth the space.`,
    };
  }
  if (!projected || !input.hasTest) {
    return { recommendation: 'retest', reason: `${input.noFitReason ?? 'No usable test yet.'} Test a sample before relying on it.` };
  }
  if (input.retestBy && input.retestBy < input.on) {
    return { recommendation: 'retest', reason: `The last test is out of date: it was due for a retest by ${dayInWords(input.retestBy)}.` };
  }
  if (projected.high - projected.low > MAX_INTERVAL_WIDTH) {
    return {
      recommendation: 'retest',
      reason: `Too uncertain: likely between ${pct(projected.low)} and ${pct(projected.high)}. A test with more seeds would narrow it.`,
    };
  }
  const bar = input.thresholdIsStandard ? `the ${input.threshold}% minimum standard for the species` : `the bank's ${input.threshold}% threshold`;
  if (projected.low >= input.threshold) {
    return { recommendation: 'sow', reason: `Projected ${pct(projected.percent)} (at least ${pct(projected.low)}), at or above ${bar}.` };
  }
  const perPlant = 1 / ((projected.percent / 100) * input.establishment);
  return {
    recommendation: 'sow-thick',
    reason: `Projected ${pct(projected.percent)}, but it may be as low as ${pct(projected.low)}, under ${bar}: sow about ${perPlant.toFixed(1)} seeds per plant wanted.`,
  };
}
