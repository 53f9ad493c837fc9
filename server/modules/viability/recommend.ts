/*
 * What to do with a lot for one sowing date, with the reason in words. Pure: the caller brings the
 * lot's figures (viability.service.ts) and gets back one of six pieces of advice. The rules, their
 * order and their constants are tabled in docs/decisions.md; tests/unit/recommend.test.ts checks
 * every branch and boundary.
 *
 * Order, first that applies wins:
 *   1. retire     — no seed left, or a tested lot's band is wholly under 30% at best;
 *   2. test-first — no usable test of the lot yet (an estimate from the species is a guess);
 *   3. retest     — the band straddles the threshold and the last test is past its interval,
 *                   or the last test is past the cap; never while a test runs, never soon after one;
 *   4. grow-out   — projected under 85% of initial by next season, or short of seed for the plan,
 *                   and no younger lot of the variety: sow it this year and save fresh seed;
 *   5. sow        — the band's low end reaches the threshold;
 *   6. sow-thick  — otherwise: sow more, so many seeds per plant.
 */
import { dayInWords } from '#shared/day-words';
import { addDays, frostDateIn } from '#shared/dates';
import type { RecommendationValue } from '#shared/schemas/viability';

/** 'test-first' | 'sow' | 'sow-thick' | 'retest' | 'grow-out' | 'retire' (the API's enum, one place). */
export type Recommendation = RecommendationValue;

/** A germination figure with its 95% band, percent. */
export interface Band {
  percent: number;
  low: number;
  high: number;
}

export interface DecisionInput {
  /** The sowing date decided for (ISO). */
  on: string;
  /** Null when the lot's amount is not known: that is never "no seeds left". */
  seedsOnHand: number | null;
  /** Seeds the bank's unsown plan entries need from this lot, null when none. */
  seedsNeeded: number | null;
  /** At least one usable test: a counted test that is not set aside. */
  tested: boolean;
  /** A test of the lot is running now. */
  assayRunning: boolean;
  /** `projected` comes from the species' typical figures, not from a test of this lot. */
  estimateOnly: boolean;
  /** Projected germination on `on`, with its 95% band. */
  projected: Band | null;
  /** Projected germination on `on` + 1 year, with its 95% band. */
  projectedNextSeason: Band | null;
  /** The lot's estimated initial viability, percent. */
  initialPercent: number | null;
  /** Start date of the latest usable test (ISO). */
  lastTestDate: string | null;
  /** The species' monitoring interval at this lot's storage, days. */
  monitoringIntervalDays: number | null;
  /** The species' published minimum germination, else the bank's threshold, percent. */
  threshold: number;
  thresholdIsStandard: boolean;
  /** Share of seedlings that make a plant (bank setting), 0–1. */
  establishment: number;
  /** The bank holds a younger active lot of the same species and variety. */
  youngerLotOfVariety: boolean;
  /** Why there is no projection, as a sentence. */
  noFitReason: string | null;
  /**
   * Optional: the day the advice is given (ISO, the bank's calendar); the age of the last test is
   * counted to it. Defaults to `on`. Pass it whenever `on` lies ahead, or a lot tested yesterday for
   * a sowing months away would count its test as months old.
   */
  today?: string;
  /**
   * Optional: the latest usable test's own result with its 95% band. Used only when a tested lot has
   * no projection (its fit failed), so the advice still rests on a measured figure.
   */
  latestResult?: Band | null;
}

export interface Decision {
  recommendation: Recommendation;
  reason: string;
}

/** Below this projected upper bound a lot is not worth the tray space (Hilum's rule). */
export const RETIRE_BELOW_PERCENT = 30;
/**
 * Grow out for fresh seed when next season's projection falls below this percent of the lot's initial
 * viability: the regeneration standard of the FAO Genebank Standards 2014, 4.3.4 [memory — confirm].
 */
export const REGENERATE_BELOW_PERCENT_OF_INITIAL = 85;
/**
 * A last test this old is retested whatever its band (Hilum's rule): three years of 365 days.
 * Shorter than the five years between tests of a genebank's active collection (IBPGR advisory
 * committee, quoted in a Bioversity seed-handling manual, ch. 10 [read, secondary]), as a home shelf
 * is warmer and damper than a genebank's store; good-storage seed life of common vegetables runs
 * 1–6 years (ISU Yard & Garden 1999, from Knott's Handbook [read]), so three years is most of a
 * lot's useful life.
 */
export const RETEST_CAP_DAYS = 3 * 365;
/**
 * No lot is asked for a new test within this many days of its last (Hilum's rule): a quarter of a
 * year. Sooner, a new test mostly repeats the last, and uses seed. Also the floor under a species'
 * monitoring interval, which is zero for a lot already below 85% of its initial viability.
 */
export const MIN_DAYS_BETWEEN_ASSAYS = 90;
/** The monitoring interval when the species' is unknown: one test a season (Hilum's rule). */
export const DEFAULT_MONITORING_DAYS = 365;
/** Seeds in a first test at home (common practice: a paper-towel test of 10–20 seeds). */
export const FIRST_ASSAY_SEEDS = 20;

/** The band leaves the decision open: its low end is under the threshold and its high end reaches it. */
export const straddles = (band: Band, threshold: number) => band.low < threshold && threshold <= band.high;

/**
 * The day from which `decide` asks for a retest of a lot tested on `lastTestDate`; the caller's
 * retest-by date should be this one, so reminders and the calendar agree with the advice. When the
 * band straddles the threshold, once the species' monitoring interval has run (a year when unknown,
 * never under 90 days, never over the cap); otherwise once the cap has run.
 */
export function retestDueDate(
  lastTestDate: string,
  monitoringIntervalDays: number | null,
  straddling: boolean,
): string {
  const interval = Math.max(monitoringIntervalDays ?? DEFAULT_MONITORING_DAYS, MIN_DAYS_BETWEEN_ASSAYS);
  return addDays(
    lastTestDate,
    Math.round(straddling ? Math.min(interval, RETEST_CAP_DAYS) : RETEST_CAP_DAYS),
  );
}

const pct = (v: number) => `${Math.round(v)}%`;
/**
 * A bound as a whole percent, or to one decimal where rounding would put it on a line it is compared
 * with: "74.9%", not "75%", for a low end under a 75% standard.
 */
function bound(v: number, lines: number[]): string {
  const line = lines.find((l) => v !== l && Math.round(v) === l);
  if (line === undefined) return pct(v);
  return `${(v < line ? Math.floor(v * 10 + 1e-9) : Math.ceil(v * 10 - 1e-9)) / 10}%`;
}

/** The band's low end is under the threshold: sow more seeds per plant wanted (step 6, and a thin grow-out). */
export const sowsThick = (band: Band, threshold: number) => band.low < threshold;

/** Seeds to sow for each plant wanted: 1 ÷ (germination × establishment), in words. */
export function perPlantWords(percent: number, establishment: number): string {
  const share = (percent / 100) * establishment;
  if (!(share > 0))
    return 'Too few are expected to come up to count seeds per plant: sow it as thickly as you can spare.';
  const perPlant = 1 / share;
  const n = perPlant < 10 ? perPlant.toFixed(1) : String(Math.ceil(perPlant));
  return `Sow about ${n} seeds for each plant wanted (${pct(percent)} expected to come up, and ${pct(establishment * 100)} of seedlings making a plant).`;
}

/** Hilum's advice for one lot on one sowing date, with its reason in words. */
export function decide(input: DecisionInput): Decision {
  const { on, threshold } = input;
  const lines = [threshold, RETIRE_BELOW_PERCENT];
  const bandWords = (b: Band) => `${pct(b.percent)} (likely ${bound(b.low, lines)}–${bound(b.high, lines)})`;
  const bar = input.thresholdIsStandard
    ? `the species' ${threshold}% minimum standard`
    : `the bank's ${threshold}% threshold`;

  // 1. Retire: nothing left, or a measured lot that at best comes up too thinly.
  if (input.seedsOnHand !== null && input.seedsOnHand <= 0)
    return { recommendation: 'retire', reason: 'No seeds left in the ledger: nothing to sow.' };

  // 2. Test first: no usable test. The species' figures are a guess, and a guess never retires a lot.
  if (!input.tested) {
    const opening = input.assayRunning
      ? 'A test of this lot is running; its result will decide.'
      : 'Never tested.';
    let guess = '';
    if (input.projected && input.estimateOnly) {
      guess = ` ${input.assayRunning ? 'Until then, the' : 'The'} species' typical figures guess ${bandWords(input.projected)} on ${dayInWords(on)}: a guess, not a measurement.`;
      if (input.projected.high < RETIRE_BELOW_PERCENT)
        guess +=
          ' Even at best that is too few to be worth the tray space; a test will tell whether to retire it.';
    } else if (input.noFitReason) {
      guess = ` ${input.noFitReason}`;
    }
    const ask = input.assayRunning ? '' : ` Test about ${FIRST_ASSAY_SEEDS} seeds before relying on it.`;
    return { recommendation: 'test-first', reason: `${opening}${guess}${ask}` };
  }

  // The figure the rest decides by: the projection, else the latest test's own result.
  const basis = input.projected ?? input.latestResult ?? null;
  const fromAssay = !input.projected && basis !== null;
  const figure = input.projected
    ? `Projected ${bandWords(input.projected)} on ${dayInWords(on)}`
    : basis
      ? `The latest test found ${bandWords(basis)}`
      : '';
  const afterwords =
    (fromAssay && input.noFitReason ? ` ${input.noFitReason}` : '') +
    (input.assayRunning ? ' A test of this lot is running now; its result will update this advice.' : '');
  const done = (recommendation: Recommendation, reason: string): Decision => ({
    recommendation,
    reason: reason + afterwords,
  });

  if (!basis) {
    // Cannot happen when the caller passes `latestResult` for a tested lot; said plainly if it does.
    return {
      recommendation: 'test-first',
      reason: `${input.noFitReason ?? 'No figure for this lot.'} Its tests give nothing to decide by: test about ${FIRST_ASSAY_SEEDS} seeds before relying on it.`,
    };
  }

  if (basis.high < RETIRE_BELOW_PERCENT) {
    return done(
      'retire',
      `${figure}: at best ${bound(basis.high, lines)}, too few would come up to be worth the tray space.`,
    );
  }

  // 3. Retest: only when a new test could tell something the last did not.
  if (!input.assayRunning && input.lastTestDate) {
    const today = input.today ?? on;
    const split = straddles(basis, threshold);
    const due = retestDueDate(input.lastTestDate, input.monitoringIntervalDays, split);
    if (today >= due) {
      const last = dayInWords(input.lastTestDate);
      if (!split) {
        return done(
          'retest',
          `${figure}, but the last test, on ${last}, is ${RETEST_CAP_DAYS / 365} years old or more: test again before relying on it.`,
        );
      }
      const interval = input.monitoringIntervalDays;
      const which =
        interval === null
          ? 'a year on, as no checking interval is known for the species'
          : interval < MIN_DAYS_BETWEEN_ASSAYS
            ? `${MIN_DAYS_BETWEEN_ASSAYS} days on, the shortest wait Hilum asks between tests`
            : 'the checking interval for the species where the lot is kept';
      return done(
        'retest',
        `${figure}, either side of ${bar}: a new test would settle whether to sow it as usual or thickly. The last test, on ${last}, was due for a recheck on ${dayInWords(due)} (${which}).`,
      );
    }
  }

  // 4. Grow out: renew the seed while it still comes up.
  const next = input.projectedNextSeason;
  const initial = input.initialPercent;
  // Compared multiplied out (percent × 100 against 85 × initial), so exactly 85% of initial is not under it.
  const fading =
    next !== null &&
    initial !== null &&
    initial > 0 &&
    next.percent * 100 < REGENERATE_BELOW_PERCENT_OF_INITIAL * initial;
  const short =
    input.seedsNeeded !== null && input.seedsOnHand !== null && input.seedsOnHand < input.seedsNeeded;
  const thin = sowsThick(basis, threshold);
  if ((fading || short) && !input.youngerLotOfVariety) {
    const why: string[] = [];
    if (fading) {
      const nextOn = frostDateIn(Number(on.slice(0, 4)) + 1, on.slice(5, 10)); // the same day a year on
      why.push(
        `by ${dayInWords(nextOn)} it is projected at ${pct(next.percent)}, under ${REGENERATE_BELOW_PERCENT_OF_INITIAL}% of its starting ${pct(initial)} (the genebank rule for renewing seed)`,
      );
    }
    if (short)
      why.push(
        `only ${input.seedsOnHand} seeds are left, short of the ${input.seedsNeeded} the plan needs from it`,
      );
    return done(
      'grow-out',
      `${figure}, but ${why.join(', and ')}; no younger lot of this variety is in the bank. Grow it out this year: sow it and save seed from the plants for a fresh lot. ` +
        'To keep the variety true, save from several plants kept apart from other varieties that could cross with them (seed saved from a hybrid does not come true).' +
        (thin ? ` ${perPlantWords(basis.percent, input.establishment)}` : ''),
    );
  }
  const renewal =
    (fading || short) && input.youngerLotOfVariety
      ? ' A younger lot of this variety is in the bank to carry it on.'
      : '';

  // 5. Sow, or 6. sow thick.
  if (!thin) return done('sow', `${figure}: even the low end reaches ${bar}. Sow as usual.${renewal}`);
  return done(
    'sow-thick',
    `${figure}: the low end is under ${bar}. ${perPlantWords(basis.percent, input.establishment)}${renewal}`,
  );
}
