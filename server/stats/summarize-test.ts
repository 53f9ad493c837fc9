import { clopperPearsonInterval } from './clopper-pearson';
import { germinationTiming, timingNote } from './germination-timing';
import type { GerminationCheck, GerminationTiming } from './germination-timing';
import { homogeneityChiSquare } from './homogeneity';
import type { ChiSquareResult } from './homogeneity';
import { agreementMethod, replicateAgreement } from './replicate-agreement';
import type { Agreement } from './replicate-agreement';
import type { RoughScore } from './rough-evidence';
import { germinationFromUncertainSown } from './uncertain-sown';
import { assertCount, assertFinite, assertOpenUnit, assertPositiveCount } from './validate';
import { wilsonInterval } from './wilson';

export type { Agreement, AgreementMethod } from './replicate-agreement';

/** The figures recorded for a tray when its test is finished (null or absent while it runs). */
export const FINISH_FIGURES = ['abnormal', 'ungerminated', 'fresh', 'dead', 'hard'] as const;
export type FinishFigure = (typeof FINISH_FIGURES)[number];
type FinishFigures = { [K in FinishFigure]: number | null };

/**
 * One tray (replicate) of a test. `checks` are the counts of normal seedlings — sound root and
 * shoot — found so far, cumulative. At the finish the grower adds the abnormal seedlings (recorded
 * apart, never in the count) and the ungerminated seeds, optionally split into fresh (dormant but
 * alive), dead and hard; that they add up to the seeds sown is checked where they are entered.
 */
export interface AssayTray {
  id: string;
  /** The seeds counted into the tray; for a tray not counted (`sownSd` given), the expected number. */
  seedsSown: number;
  /**
   * SD of the true number sown, for a tray sown by weight or by a rough guess (sown-estimate.ts);
   * absent or 0 when the seeds were counted.
   */
  sownSd?: number;
  checks: readonly GerminationCheck[];
  /**
   * The latest rough score of a tray whose seedlings were scored instead of counted (it has no
   * checks): it enters no percentage, only the words and, as a likelihood, the viability model.
   */
  score?: RoughScore | null;
  /** Why the grower set the tray aside (spilled, dried out); a set-aside tray enters no figure. */
  setAsideReason?: string | null;
  abnormal?: number | null;
  ungerminated?: number | null;
  fresh?: number | null;
  dead?: number | null;
  hard?: number | null;
}

export type IntervalMethod = 'wilson' | 'clopper-pearson';
/**
 * The interval a result carries: the chosen method for counted trays; 'widened-score' when seeds
 * sown were estimated (germinationFromUncertainSown: Wilson's score interval widened by the
 * uncertainty of the number sown).
 */
export type IntervalKind = IntervalMethod | 'widened-score';

export interface SummarizeOptions {
  /** Confidence level of the interval, default 0.95. */
  confidence?: number;
  /** Default 'wilson'. */
  intervalMethod?: IntervalMethod;
}

/**
 * 'counted': in the figures. 'not-counted': no count yet, left out of the running figures.
 * 'scored': scored roughly, in no percentage. 'set-aside': set aside by the grower, left out of every figure.
 */
export type TrayState = 'counted' | 'not-counted' | 'scored' | 'set-aside';

export interface TrayPercent extends FinishFigures {
  id: string;
  /** The seeds counted into the tray; null when they were not counted (see sownMean). */
  seedsSown: number | null;
  /** Expected seeds sown (the count itself when counted). */
  sownMean: number;
  /** SD of the true number sown (0 when counted). */
  sownSd: number;
  /** The tray's latest rough score, when it was scored instead of counted. */
  score: RoughScore | null;
  state: TrayState;
  setAsideReason: string | null;
  /** Latest cumulative count of normal seedlings; null unless the tray is counted (in the figures). */
  germinated: number | null;
  /** 0–100, full precision; null unless the tray is counted (in the figures). */
  percent: number | null;
}

type NullableTiming = { [K in keyof GerminationTiming]: GerminationTiming[K] | null };

export interface AssaySummary extends NullableTiming, FinishFigures {
  traysTotal: number;
  /** Trays with at least one count and not set aside; only these enter the figures below. */
  traysCounted: number;
  /** Trays the grower set aside; they enter no figure. */
  traysSetAside: number;
  /** Seeds sown in the counted trays (expected, when any was not counted). */
  sown: number | null;
  /** Whether the seeds sown in the counted trays were estimated (by weight or guess), not counted. */
  seedsSownEstimated: boolean;
  /** SD of the true number sown in the counted trays (0 when counted); null when no tray is counted. */
  sownSd: number | null;
  /**
   * More seedlings than the estimate of seeds sown makes plausible (μ + zτ): no percentage is given.
   */
  seedlingsExceedSown: boolean;
  /** Normal seedlings in the counted trays. */
  germinated: number | null;
  /** Pooled germination (normal seedlings), 0–100, full precision. */
  percent: number | null;
  /** Pooled germination rounded to the whole percent, as the seed-testing rules report it. */
  percentRounded: number | null;
  interval: { low: number; high: number; method: IntervalKind; confidence: number } | null;
  trayPercents: TrayPercent[];
  /** Null figures when fewer than two trays have been counted. */
  agreement: Agreement;
  /** Null when fewer than two trays have been counted. */
  homogeneity: ChiSquareResult | null;
  /** Why timing figures are null, in a grower's words; null when they are all given. */
  timingNote: string | null;
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
export function poolChecks(trays: readonly Pick<AssayTray, 'checks'>[]): GerminationCheck[] {
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

function validateTrays(trays: readonly AssayTray[]): void {
  const ids = new Set<string>();
  trays.forEach((t, i) => {
    const where = `trays[${String(i)}]`;
    if (ids.has(t.id)) throw new RangeError(`${where}.id "${t.id}" is used by another tray`);
    ids.add(t.id);
    const estimated = isEstimated(t);
    if (estimated) {
      assertFinite(t.seedsSown, `${where}.seedsSown`);
      assertFinite(t.sownSd ?? 0, `${where}.sownSd`);
      if (t.seedsSown <= 0 || (t.sownSd ?? 0) < 0)
        throw new RangeError(`${where}: an estimate of seeds sown needs a mean above 0 and an SD ≥ 0`);
    } else {
      assertPositiveCount(t.seedsSown, `${where}.seedsSown`);
    }
    if (t.score != null && t.checks.length > 0)
      throw new RangeError(`${where}: a tray is either counted or scored roughly, not both`);
    for (const c of t.checks) {
      assertCount(c.cumulative, `${where} cumulative`);
      if (!estimated && c.cumulative > t.seedsSown) {
        throw new RangeError(
          `${where}: cumulative count ${String(c.cumulative)} exceeds the ${String(t.seedsSown)} seeds sown`,
        );
      }
    }
    germinationTiming(t.checks); // checks ordering, duplicate days and falling counts per tray
    for (const key of FINISH_FIGURES) {
      const v = t[key];
      if (v !== null && v !== undefined) assertCount(v, `${where}.${key}`);
    }
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

function finishFigures(t: AssayTray): FinishFigures {
  return {
    abnormal: t.abnormal ?? null,
    ungerminated: t.ungerminated ?? null,
    fresh: t.fresh ?? null,
    dead: t.dead ?? null,
    hard: t.hard ?? null,
  };
}

function trayState(t: AssayTray): TrayState {
  if (t.setAsideReason !== null && t.setAsideReason !== undefined) return 'set-aside';
  if (t.score != null) return 'scored';
  return t.checks.length === 0 ? 'not-counted' : 'counted';
}

/** A tray whose seeds were estimated (sown by weight or guess), not counted. */
const isEstimated = (t: AssayTray) => (t.sownSd ?? 0) > 0;

/** Each finish figure summed over the trays, or null unless every one of them has it. */
function pooledFinish(trays: readonly AssayTray[]): FinishFigures {
  const pooled = (key: FinishFigure): number | null => {
    if (trays.length === 0) return null;
    let total = 0;
    for (const t of trays) {
      const v = t[key];
      if (v === null || v === undefined) return null;
      total += v;
    }
    return total;
  };
  return {
    abnormal: pooled('abnormal'),
    ungerminated: pooled('ungerminated'),
    fresh: pooled('fresh'),
    dead: pooled('dead'),
    hard: pooled('hard'),
  };
}

/**
 * The pooled checks of the counted trays for the timing figures. A pooled count of 0 is kept only
 * on a day every tray had been checked by: before a tray's first check its 0 is poolChecks'
 * assumption, and a count of 0 is what tells the timing measures when seedlings were not yet up.
 */
function pooledForTiming(counted: readonly AssayTray[]): GerminationCheck[] {
  const firstCheck = counted.map((t) => Math.min(...t.checks.map((c) => c.day)));
  const allCheckedBy = Math.max(...firstCheck);
  return poolChecks(counted).filter((c) => c.cumulative > 0 || c.day >= allCheckedBy);
}

/**
 * The result of a germination test from its trays (replicates): pooled percentage of normal
 * seedlings with its interval, per-tray percentages, replicate agreement (tolerance table or
 * chi-square, replicate-agreement.ts), chi-square homogeneity, the timing measures of the pooled
 * counts where the counts support them (timingNote says why not) and the pooled finish figures.
 *
 * Only counted trays enter the figures: a tray not counted yet is left out of the running figures,
 * and a tray the grower set aside is left out of every figure. Figures that cannot be computed are
 * null; the summary is plain JSON (no undefined, NaN or infinities), as it is stored.
 */
export function summarizeTest(trays: readonly AssayTray[], options: SummarizeOptions = {}): AssaySummary {
  const confidence = options.confidence ?? 0.95;
  const method = options.intervalMethod ?? 'wilson';
  assertOpenUnit(confidence, 'confidence');
  validateTrays(trays);

  const states = trays.map(trayState);
  const counted = trays.filter((_, i) => states[i] === 'counted');
  const trayPercents: TrayPercent[] = trays.map((t, i) => {
    const state = states[i] ?? 'not-counted';
    const germinated = state === 'counted' ? lastCumulative(t.checks) : null;
    const estimated = isEstimated(t);
    return {
      id: t.id,
      seedsSown: estimated ? null : t.seedsSown,
      sownMean: t.seedsSown,
      sownSd: estimated ? (t.sownSd ?? 0) : 0,
      score: state === 'scored' ? (t.score ?? null) : null,
      state,
      setAsideReason: state === 'set-aside' ? (t.setAsideReason ?? null) : null,
      germinated,
      // An estimated tray's own share is shown at most 100% (the pooled figure says when it is more).
      percent: germinated === null ? null : Math.min(100, (100 * germinated) / t.seedsSown),
      ...finishFigures(t),
    };
  });
  const inPlay = trays.filter((_, i) => states[i] !== 'set-aside' && states[i] !== 'scored');
  const designMethod = agreementMethod(inPlay.map((t) => t.seedsSown));
  const base = {
    traysTotal: trays.length,
    traysCounted: counted.length,
    traysSetAside: states.filter((s) => s === 'set-aside').length,
    trayPercents,
    ...pooledFinish(counted),
  };
  if (counted.length === 0) {
    return {
      ...base,
      ...NO_TIMING,
      sown: null,
      seedsSownEstimated: false,
      sownSd: null,
      seedlingsExceedSown: false,
      percent: null,
      percentRounded: null,
      interval: null,
      agreement: replicateAgreement([], null, designMethod),
      homogeneity: null,
      timingNote: null,
    };
  }

  const perTray = counted.map((t) => ({ germinated: lastCumulative(t.checks), sown: t.seedsSown }));
  const sown = perTray.reduce((s, t) => s + t.sown, 0);
  const germinated = perTray.reduce((s, t) => s + t.germinated, 0);
  const pooled = pooledForTiming(counted);
  if (counted.some(isEstimated)) {
    return {
      ...base,
      ...germinationTiming(pooled),
      ...estimatedFigures(counted, germinated, sown, confidence),
    };
  }
  const percentRounded = roundPercent(germinated, sown);
  const bounds =
    method === 'wilson'
      ? wilsonInterval(germinated, sown, confidence)
      : clopperPearsonInterval(germinated, sown, confidence);

  return {
    ...base,
    ...germinationTiming(pooled),
    sown,
    seedsSownEstimated: false,
    sownSd: 0,
    seedlingsExceedSown: false,
    germinated,
    percent: (100 * germinated) / sown,
    percentRounded,
    interval: { low: 100 * bounds.low, high: 100 * bounds.high, method, confidence },
    agreement: replicateAgreement(perTray, percentRounded, designMethod),
    homogeneity: counted.length >= 2 ? homogeneityChiSquare(perTray) : null,
    timingNote: timingNote(pooled),
  };
}

/**
 * The pooled figures when some counted tray's seeds were estimated: the trays' estimates are
 * independent, so their means and variances add; the interval is germinationFromUncertainSown's
 * (Wilson's score interval widened by the uncertainty of the number sown). Replicate agreement and
 * homogeneity need the numbers sown, so they are not judged.
 */
function estimatedFigures(
  counted: readonly AssayTray[],
  germinated: number,
  sown: number,
  confidence: number,
) {
  const sownSd = Math.sqrt(counted.reduce((s, t) => s + (isEstimated(t) ? (t.sownSd ?? 0) ** 2 : 0), 0));
  const g = germinationFromUncertainSown(germinated, { mean: sown, sd: sownSd }, confidence);
  const percent = g.kind === 'estimate' ? 100 * g.fraction : null;
  return {
    sown,
    seedsSownEstimated: true,
    sownSd,
    seedlingsExceedSown: g.kind === 'more-seedlings-than-sown',
    germinated,
    percent,
    percentRounded: percent === null ? null : Math.round(percent),
    interval:
      g.kind === 'estimate'
        ? {
            low: 100 * g.interval.low,
            high: 100 * g.interval.high,
            method: 'widened-score' as const,
            confidence,
          }
        : null,
    agreement: replicateAgreement([], null, 'tolerance-table'),
    homogeneity: null,
    timingNote: timingNote(pooledForTiming(counted)),
  };
}
