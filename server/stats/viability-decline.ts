import { normalCdf, normalPdf, normalQuantile, twoSidedZ } from './distributions';
import { fitProbitGlm } from './probit-glm';
import { probitRegression, probitRegressionGroups } from './probit-regression';
import {
  assertFinite,
  assertOpenUnit,
  assertPercent,
  assertPositiveCount,
  assertSuccesses,
} from './validate';

/** One germination test of a lot: its age (years since harvest) and the count. */
export interface ViabilityAssay {
  ageYears: number;
  germinated: number;
  sown: number;
}

/** A species-wide slope fitted elsewhere: probits per year (negative) and its standard error. */
export interface SpeciesSlope {
  slope: number;
  slopeSe: number;
}

/**
 * What the fit may borrow when the lot's own tests do not show its rate of decline. Tried in this
 * order: a pooled fit over `otherLots`, then `speciesSlope`, then the typical storage life.
 */
export interface ViabilityPrior {
  /** Tests of the species' other lots in the bank, one array per lot (common slope, own intercepts). */
  otherLots?: readonly (readonly ViabilityAssay[])[];
  /** A slope already pooled for the species. */
  speciesSlope?: SpeciesSlope;
  /**
   * The species' usual storage life in years, read as the age at which viability falls to 50%.
   * The caller takes it from the species reference set (e.g. "seed life in years under good
   * storage", ISU Yard & Garden 1999 from Knott's Handbook, in REFERENCES.md); reading those
   * figures as a 50% point is our assumption.
   */
  typicalLifeYears?: number;
  /**
   * The usual initial germination the typical life starts from. Default 85: FAO Genebank
   * Standards (2014) 4.3.2 ask for initial germination above 85%.
   */
  typicalInitialPercent?: number;
}

export interface ViabilityOptions {
  /** Confidence level of projected intervals, default 0.95. */
  confidence?: number;
  /** Germination percent the projected lower bound should not fall below before a retest. */
  retestThresholdPercent?: number;
}

export type ViabilityBasis = 'lot' | 'species' | 'typical';

export type RetestReason = 'lower-bound' | 'monitoring-interval' | 'one-year-cap';

export interface ViabilityFit {
  /** 100·Φ(Ki). */
  initialPercent: number;
  /** Ki, initial viability in probits. */
  initialProbit: number;
  /** −1/σ, probits per year. */
  slopePerYear: number;
  /** σ, years for viability to fall by one probit. */
  sigmaYears: number;
  /** Age at which viability reaches 50% (Ki·σ); ≤ 0 when the lot never was above 50%. */
  halfLifeYears: number;
  /** Covariance of (Ki, slope) on the probit scale, for the delta method. */
  covariance: [[number, number], [number, number]];
  basis: ViabilityBasis;
  confidence: number;
  lastAssayAgeYears: number;
  /** Age (years) by which the lot should be retested; the caller turns it into a date. */
  retestByAgeYears: number;
  retestReason: RetestReason;
  /** Plain-language remarks on fall-backs and assumptions. */
  notes: string[];
}

export interface ViabilityProjection {
  percent: number;
  low: number;
  high: number;
}

const DEFAULT_TYPICAL_INITIAL_PERCENT = 85; // FAO Genebank Standards 2014, 4.3.2
/** FAO Genebank Standards 2014, 4.3.3 (from memory): monitor at ⅓ of the time to fall to 85% of initial. */
const MONITORING_FRACTION_OF_INITIAL = 0.85;
const MONITORING_SHARE = 1 / 3;
const RETEST_CAP_YEARS = 1;

function validateAssays(assays: readonly ViabilityAssay[], where: string): void {
  assays.forEach((t, i) => {
    const at = `${where}[${String(i)}]`;
    assertFinite(t.ageYears, `${at}.ageYears`);
    if (t.ageYears < 0) throw new RangeError(`${at}.ageYears must be ≥ 0 (got ${String(t.ageYears)})`);
    assertPositiveCount(t.sown, `${at}.sown`);
    assertSuccesses(t.germinated, t.sown, `${at}.germinated`);
  });
}

function distinctAges(assays: readonly ViabilityAssay[]): number {
  return new Set(assays.map((t) => t.ageYears)).size;
}

function oneSided(assays: readonly ViabilityAssay[]): boolean {
  return assays.every((t) => t.germinated === t.sown) || assays.every((t) => t.germinated === 0);
}

interface BorrowedSlope {
  slope: number;
  variance: number;
  basis: 'species' | 'typical';
}

function pooledSpeciesSlope(prior: ViabilityPrior, notes: string[]): BorrowedSlope | null {
  const lots = (prior.otherLots ?? []).filter((lot) => distinctAges(lot) >= 2 && !oneSided(lot));
  if (lots.length === 0) return null;
  const fit = probitRegressionGroups(
    lots.map((lot) => ({
      points: lot.map((t) => ({ x: t.ageYears, successes: t.germinated, trials: t.sown })),
    })),
  );
  if (!fit.converged) {
    notes.push(
      `The pooled fit over the species' other lots did not give a usable slope (${fit.warning ?? 'no convergence'}).`,
    );
    return null;
  }
  if (!(fit.slope < 0)) {
    notes.push("The species' other lots show no decline with age; their pooled slope was not used.");
    return null;
  }
  return { slope: fit.slope, variance: fit.seSlope ** 2, basis: 'species' };
}

function borrowSlope(prior: ViabilityPrior, notes: string[]): BorrowedSlope {
  const pooled = pooledSpeciesSlope(prior, notes);
  if (pooled !== null) return pooled;
  const given = prior.speciesSlope;
  if (given !== undefined) {
    assertFinite(given.slope, 'speciesSlope.slope');
    assertFinite(given.slopeSe, 'speciesSlope.slopeSe');
    if (given.slope < 0 && given.slopeSe >= 0)
      return { slope: given.slope, variance: given.slopeSe ** 2, basis: 'species' };
    notes.push('The given species slope is not a decline; it was not used.');
  }
  const life = prior.typicalLifeYears;
  if (life === undefined) {
    throw new RangeError(
      "cannot estimate the rate of decline: the lot's tests do not show it and no species data or typical storage life was given",
    );
  }
  assertFinite(life, 'typicalLifeYears');
  if (life <= 0) throw new RangeError(`typicalLifeYears must be positive (got ${String(life)})`);
  const initial = prior.typicalInitialPercent ?? DEFAULT_TYPICAL_INITIAL_PERCENT;
  assertPercent(initial, 'typicalInitialPercent');
  if (initial <= 50 || initial >= 100)
    throw new RangeError('typicalInitialPercent must be above 50 and below 100');
  notes.push(
    `Rate of decline taken from the species' typical storage life (${String(life)} years from ${String(initial)}% to 50%); its uncertainty is not known, so the interval reflects only this lot's tests.`,
  );
  // Ki − life/σ = 0 with Ki = Φ⁻¹(initial): σ = life / Φ⁻¹(initial).
  return { slope: -normalQuantile(initial / 100) / life, variance: 0, basis: 'typical' };
}

/**
 * Ki with the slope held fixed (a probit fit with offset slope·age), and its covariance with the
 * slope by the delta method: Ki depends on the borrowed slope through dKi/db = −(weighted mean age).
 */
function interceptForSlope(assays: readonly ViabilityAssay[], borrowed: BorrowedSlope, notes: string[]) {
  const adjust = oneSided(assays);
  if (adjust) {
    notes.push(
      'Every test of this lot was 100% (or 0%), which has no finite estimate; its initial viability uses the usual half-seed correction (x + ½)/(n + 1) (common practice).',
    );
  }
  const rows = assays.map((t) => ({
    covariates: [1],
    offset: borrowed.slope * t.ageYears,
    successes: adjust ? t.germinated + 0.5 : t.germinated,
    trials: adjust ? t.sown + 1 : t.sown,
  }));
  const fit = fitProbitGlm(rows, 1);
  const ki = fit.coefficients[0] ?? Number.NaN;
  const conditionalVariance = fit.covariance[0]?.[0] ?? Number.NaN;
  let weightSum = 0;
  let weightedAge = 0;
  rows.forEach((row, i) => {
    const eta = ki + row.offset;
    const w = (row.trials * normalPdf(eta) ** 2) / Math.max(1e-300, normalCdf(eta) * normalCdf(-eta));
    weightSum += w;
    weightedAge += w * (assays[i]?.ageYears ?? 0);
  });
  const meanAge = weightSum > 0 ? weightedAge / weightSum : 0;
  const vb = borrowed.variance;
  const cross = vb === 0 ? 0 : -meanAge * vb;
  const covariance: [[number, number], [number, number]] = [
    [conditionalVariance + meanAge * meanAge * vb, cross],
    [cross, vb],
  ];
  return { ki, covariance };
}

/** Projected germination (percent) with its delta-method interval at an age. */
export function projectViability(
  fit: Pick<ViabilityFit, 'initialProbit' | 'slopePerYear' | 'covariance' | 'confidence'>,
  ageYears: number,
  confidence: number = fit.confidence,
): ViabilityProjection {
  assertFinite(ageYears, 'ageYears');
  assertOpenUnit(confidence, 'confidence');
  const eta = fit.initialProbit + fit.slopePerYear * ageYears;
  const [[vaa, vab], [, vbb]] = fit.covariance;
  const se = Math.sqrt(Math.max(0, vaa + 2 * ageYears * vab + ageYears * ageYears * vbb));
  const z = twoSidedZ(confidence);
  return {
    percent: 100 * normalCdf(eta),
    low: 100 * normalCdf(eta - z * se),
    high: 100 * normalCdf(eta + z * se),
  };
}

/**
 * Retest age: the earliest of (a) the age at which the projected lower bound reaches
 * `thresholdPercent` (skipped when no threshold is given), (b) the last test plus one third of the
 * time the point estimate takes to fall to 85% of initial viability (FAO Genebank Standards 2014,
 * 4.3.3 — from memory), and (c) one year after the last test.
 */
export function retestAge(
  fit: Pick<
    ViabilityFit,
    'initialProbit' | 'slopePerYear' | 'covariance' | 'confidence' | 'lastAssayAgeYears'
  >,
  thresholdPercent?: number,
): { ageYears: number; reason: RetestReason } {
  const last = fit.lastAssayAgeYears;
  const cap = last + RETEST_CAP_YEARS;
  let best: { ageYears: number; reason: RetestReason } = { ageYears: cap, reason: 'one-year-cap' };

  const target = normalQuantile(MONITORING_FRACTION_OF_INITIAL * normalCdf(fit.initialProbit));
  const yearsTo85 = (target - fit.initialProbit) / fit.slopePerYear;
  const monitoring = last + MONITORING_SHARE * yearsTo85;
  if (monitoring < best.ageYears) best = { ageYears: monitoring, reason: 'monitoring-interval' };

  if (thresholdPercent !== undefined) {
    assertPercent(thresholdPercent, 'retestThresholdPercent');
    const low = (age: number) => projectViability(fit, age).low;
    // The lower bound falls with age from the last test on (η falls, its standard error grows past
    // the centre of the tested ages), so the crossing is found by bisection within [last, cap].
    let crossing: number | null = null;
    if (low(last) <= thresholdPercent) crossing = last;
    else if (low(best.ageYears) <= thresholdPercent) {
      let a = last;
      let b = best.ageYears;
      for (let i = 0; i < 60; i++) {
        const mid = (a + b) / 2;
        if (low(mid) <= thresholdPercent) b = mid;
        else a = mid;
      }
      crossing = b;
    }
    if (crossing !== null && crossing < best.ageYears) best = { ageYears: crossing, reason: 'lower-bound' };
  }
  return best;
}

/**
 * Seed viability equation (Ellis & Roberts 1980, Ann. Bot. 45:13–30): probit viability
 * v = Ki − age/σ, fitted by maximum likelihood (binomial GLM, probit link) to a lot's tests.
 *
 * - Two or more tests at different ages with a fitted decline: Ki and σ from the lot (basis 'lot').
 * - Otherwise the lot keeps its own Ki, fitted with the slope held at a borrowed value: a pooled
 *   common-slope fit over the species' other lots or a given species slope (basis 'species'), or
 *   the species' typical storage life (basis 'typical'). A lot fit with no decline (slope ≥ 0) or
 *   with no finite estimate falls back the same way, and `notes` says so.
 *
 * Throws a RangeError when there is no test, or when a borrowed slope is needed and none is given.
 */
export function fitViabilityDecline(
  assays: readonly ViabilityAssay[],
  prior: ViabilityPrior = {},
  options: ViabilityOptions = {},
): ViabilityFit {
  if (assays.length === 0) throw new RangeError('at least one germination test is needed');
  validateAssays(assays, 'tests');
  (prior.otherLots ?? []).forEach((lot, i) => validateAssays(lot, `prior.otherLots[${String(i)}]`));
  const confidence = options.confidence ?? 0.95;
  assertOpenUnit(confidence, 'confidence');
  const notes: string[] = [];

  let basis: ViabilityBasis;
  let ki: number;
  let slope: number;
  let covariance: [[number, number], [number, number]];
  const lotFit =
    distinctAges(assays) >= 2
      ? probitRegression(assays.map((t) => ({ x: t.ageYears, successes: t.germinated, trials: t.sown })))
      : null;
  if (lotFit !== null && lotFit.converged && lotFit.slope < 0) {
    basis = 'lot';
    ki = lotFit.intercept;
    slope = lotFit.slope;
    covariance = lotFit.covariance;
  } else {
    if (lotFit === null)
      notes.push('This lot has been tested at one age only, so its rate of decline is borrowed.');
    else if (!lotFit.converged)
      notes.push(
        `The lot's own tests give no finite decline estimate (${lotFit.warning ?? 'no convergence'}); the rate of decline is borrowed.`,
      );
    else
      notes.push(
        "The lot's tests show no decline with age (fitted slope ≥ 0); the rate of decline is borrowed.",
      );
    const borrowed = borrowSlope(prior, notes);
    const intercept = interceptForSlope(assays, borrowed, notes);
    basis = borrowed.basis;
    ki = intercept.ki;
    slope = borrowed.slope;
    covariance = intercept.covariance;
  }

  const sigmaYears = -1 / slope;
  const lastAssayAgeYears = Math.max(...assays.map((t) => t.ageYears));
  const partial = { initialProbit: ki, slopePerYear: slope, covariance, confidence, lastAssayAgeYears };
  const retest = retestAge(partial, options.retestThresholdPercent);
  return {
    ...partial,
    initialPercent: 100 * normalCdf(ki),
    sigmaYears,
    halfLifeYears: ki * sigmaYears,
    basis,
    retestByAgeYears: retest.ageYears,
    retestReason: retest.reason,
    notes,
  };
}
