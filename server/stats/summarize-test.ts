import { clopperPearsonInterval } from './clopper-pearson';
import { germinationTiming, timingNote } from './germination-timing';
import type { GerminationCheck, GerminationTiming } from './germination-timing';
import { homogeneityChiSquare } from './homogeneity';
import type { ChiSquareResult } from './homogeneity';
import { agreementMethod, replicateAgreement } from './replicate-agreement';
import type { Agreement } from './replicate-agreement';
import { assertCount, assertOpenUnit, assertPositiveCount } from './validate';
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
  seedsSown: number;
  checks: readonly GerminationCheck[];
  /** Why the grower set the tray aside (spilled, dried out); a set-aside tray enters no figure. */
  setAsideReason?: string | null;
  abnormal?: number | null;
  ungerminated?: number | null;
  fresh?: number | null;
  dead?: number | null;
  hard?: number | null;
}

export type IntervalMethod = 'wilson' | 'clopper-pearson';

export interface SummarizeOptions {
  /** Confidence level of the interval, default 0.95. */
  confidence?: number;
  /** Default 'wilson'. */
  intervalMethod?: IntervalMethod;
}

/**
 * 'counted': in the figures. 'not-counted': no count yet, left out of the running figures.
 * 'set-aside': set aside by the grower, left out of every figure.
 */
export type TrayState = 'counted' | 'not-counted' | 'set-aside';

export interface TrayPercent extends FinishFigures {
  id: string;
  seedsSown: number;
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
  /** Seeds sown in the counted trays. */
  sown: number | null;
  /** Normal seedlings in the counted trays. */
  germinated: number | null;
  /** Pooled germination (normal seedlings), 0–100, full precision. */
  percent: number | null;
  /** Pooled germination rounded to the whole percent, as the seed-testing rules report it. */
  percentRounded: number | null;
  interval: { low: number; high: number; method: IntervalMethod; confidence: number } | null;
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
  return t.checks.length === 0 ? 'not-counted' : 'counted';
}

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
    return {
      id: t.id,
      seedsSown: t.seedsSown,
      state,
      setAsideReason: state === 'set-aside' ? (t.setAsideReason ?? null) : null,
      germinated,
      percent: germinated === null ? null : (100 * germinated) / t.seedsSown,
      ...finishFigures(t),
    };
  });
  const inPlay = trays.filter((_, i) => states[i] !== 'set-aside');
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
  const percentRounded = roundPercent(germinated, sown);
  const bounds =
    method === 'wilson'
      ? wilsonInterval(germinated, sown, confidence)
      : clopperPearsonInterval(germinated, sown, confidence);

  const pooled = pooledForTiming(counted);
  return {
    ...base,
    ...germinationTiming(pooled),
    sown,
    germinated,
    percent: (100 * germinated) / sown,
    percentRounded,
    interval: { low: 100 * bounds.low, high: 100 * bounds.high, method, confidence },
    agreement: replicateAgreement(perTray, percentRounded, designMethod),
    homogeneity: counted.length >= 2 ? homogeneityChiSquare(perTray) : null,
    timingNote: timingNote(pooled),
  };
}
