import { clopperPearsonInterval } from './clopper-pearson';
import { germinationTiming } from './germination-timing';
import type { GerminationCheck, GerminationTiming } from './germination-timing';
import { homogeneityChiSquare } from './homogeneity';
import type { ChiSquareResult } from './homogeneity';
import { maxToleratedRange } from './tolerated-range';
import { assertCount, assertOpenUnit, assertPositiveCount } from './validate';
import { wilsonInterval } from './wilson';

export interface TestTray {
  id: string;
  seedsSown: number;
  checks: readonly GerminationCheck[];
}

export type IntervalMethod = 'wilson' | 'clopper-pearson';

export interface SummarizeOptions {
  /** Confidence level of the interval, default 0.95. */
  confidence?: number;
  /** Default 'wilson'. */
  intervalMethod?: IntervalMethod;
}

export interface TrayPercent {
  id: string;
  seedsSown: number;
  /** Latest cumulative count; null while the tray has not been counted. */
  germinated: number | null;
  /** 0–100, full precision; null while the tray has not been counted. */
  percent: number | null;
}

export interface Agreement {
  /** Maximum tolerated range (percentage points) for the rounded mean, replicates and tray size. */
  maxRange: number | null;
  /** Highest minus lowest tray percentage (percentage points). */
  observedRange: number | null;
  ok: boolean | null;
}

type NullableTiming = { [K in keyof GerminationTiming]: GerminationTiming[K] | null };

export interface TestSummary extends NullableTiming {
  traysTotal: number;
  /** Trays with at least one count; only these enter the figures below. */
  traysCounted: number;
  /** Seeds sown in the counted trays. */
  sown: number | null;
  germinated: number | null;
  /** Pooled germination, 0–100, full precision. */
  percent: number | null;
  /** Pooled germination rounded to the whole percent, as the seed-testing rules report it. */
  percentRounded: number | null;
  interval: { low: number; high: number; method: IntervalMethod; confidence: number } | null;
  trayPercents: TrayPercent[];
  /** Null members when fewer than two trays have been counted. */
  agreement: Agreement;
  /** Null when fewer than two trays have been counted. */
  homogeneity: ChiSquareResult | null;
}

function lastCumulative(checks: readonly GerminationCheck[]): number {
  let latestDay = Number.NEGATIVE_INFINITY;
  let count = 0;
  for (const c of checks) {
    if (c.day > latestDay) {
      latestDay = c.day;
      count = c.cumulative;
    }
  }
  return count;
}

/**
 * Pools the trays' counts by day: on every day any tray was checked, each tray contributes its
 * latest cumulative count on or before that day (carried forward; 0 before its first count).
 */
export function poolChecks(trays: readonly Pick<TestTray, 'checks'>[]): GerminationCheck[] {
  const days = [...new Set(trays.flatMap((t) => t.checks.map((c) => c.day)))].sort((a, b) => a - b);
  const sortedTrays = trays.map((t) => [...t.checks].sort((a, b) => a.day - b.day));
  return days.map((day) => ({
    day,
    cumulative: sortedTrays.reduce((sum, checks) => {
      let carried = 0;
      for (const c of checks) {
        if (c.day > day) break;
        carried = c.cumulative;
      }
      return sum + carried;
    }, 0),
  }));
}

/** ISTA rounding to the nearest whole percent (halves up), done in integers to avoid 84.4999… */
function roundPercent(germinated: number, sown: number): number {
  return Math.floor((200 * germinated + sown) / (2 * sown));
}

function validateTrays(trays: readonly TestTray[]): void {
  const ids = new Set<string>();
  trays.forEach((t, i) => {
    const where = `trays[${String(i)}]`;
    if (ids.has(t.id)) throw new RangeError(`${where}.id "${t.id}" is used by another tray`);
    ids.add(t.id);
    assertPositiveCount(t.seedsSown, `${where}.seedsSown`);
    for (const c of t.checks) {
      assertCount(c.cumulative, `${where} cumulative`);
      if (c.cumulative > t.seedsSown) {
        throw new RangeError(
          `${where}: cumulative count ${String(c.cumulative)} exceeds the ${String(t.seedsSown)} seeds sown`,
        );
      }
    }
    germinationTiming(t.checks); // checks ordering, duplicate days and falling counts per tray
  });
}

const NO_TIMING: NullableTiming = {
  germinated: null,
  meanDays: null,
  variance: null,
  rate: null,
  coefficientOfVelocity: null,
  t50Days: null,
  t50DaysCoolbear: null,
  speedIndex: null,
  uncertaintyBits: null,
  synchrony: null,
};

/**
 * The result of a germination test from its trays (replicates): pooled percentage with its
 * interval, per-tray percentages, replicate agreement (tolerated range and chi-square homogeneity)
 * and the timing measures of the pooled counts. Figures that cannot be computed yet are null.
 */
export function summarizeTest(trays: readonly TestTray[], options: SummarizeOptions = {}): TestSummary {
  const confidence = options.confidence ?? 0.95;
  const method = options.intervalMethod ?? 'wilson';
  assertOpenUnit(confidence, 'confidence');
  validateTrays(trays);

  const counted = trays.filter((t) => t.checks.length > 0);
  const trayPercents: TrayPercent[] = trays.map((t) => {
    if (t.checks.length === 0) return { id: t.id, seedsSown: t.seedsSown, germinated: null, percent: null };
    const germinated = lastCumulative(t.checks);
    return { id: t.id, seedsSown: t.seedsSown, germinated, percent: (100 * germinated) / t.seedsSown };
  });
  const base = { traysTotal: trays.length, traysCounted: counted.length, trayPercents };
  if (counted.length === 0) {
    return {
      ...base,
      ...NO_TIMING,
      sown: null,
      percent: null,
      percentRounded: null,
      interval: null,
      agreement: { maxRange: null, observedRange: null, ok: null },
      homogeneity: null,
    };
  }

  const perTray = counted.map((t) => ({ germinated: lastCumulative(t.checks), sown: t.seedsSown }));
  const sown = perTray.reduce((s, t) => s + t.sown, 0);
  const germinated = perTray.reduce((s, t) => s + t.germinated, 0);
  const percentRounded = roundPercent(germinated, sown);
  const bounds =
    method === 'wilson'
      ? wilsonInterval(germinated, sown, confidence)
      : clopperPearsonInterval(germinated, sown, confidence);

  let agreement: Agreement = { maxRange: null, observedRange: null, ok: null };
  let homogeneity: ChiSquareResult | null = null;
  if (counted.length >= 2) {
    const percents = perTray.map((t) => (100 * t.germinated) / t.sown);
    const observedRange = Math.max(...percents) - Math.min(...percents);
    const maxRange = maxToleratedRange(percentRounded, counted.length, sown / counted.length);
    agreement = { maxRange, observedRange, ok: observedRange <= maxRange };
    homogeneity = homogeneityChiSquare(perTray);
  }

  const timing = germinationTiming(poolChecks(counted));
  return {
    ...base,
    ...timing,
    sown,
    germinated,
    percent: (100 * germinated) / sown,
    percentRounded,
    interval: { low: 100 * bounds.low, high: 100 * bounds.high, method, confidence },
    agreement,
    homogeneity,
  };
}
