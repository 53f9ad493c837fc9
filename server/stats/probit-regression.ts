import { fitProbitGlm } from './probit-glm';
import type { ProbitRow } from './probit-glm';
import type { Matrix } from './linear-algebra';
import { assertFinite, assertSuccesses } from './validate';

/** A binomial observation at covariate x (for viability: successes germinated of trials sown at age x). */
export interface DosePoint {
  x: number;
  successes: number;
  trials: number;
}

export interface ProbitRegressionResult {
  /** a in P = Φ(a + b·x). */
  intercept: number;
  /** b in P = Φ(a + b·x). */
  slope: number;
  /** [[Var a, Cov], [Cov, Var b]], inverse Fisher information. */
  covariance: [[number, number], [number, number]];
  seIntercept: number;
  seSlope: number;
  deviance: number;
  logLikelihood: number;
  iterations: number;
  converged: boolean;
  /** Why the estimates cannot be trusted, when they cannot. */
  warning: string | null;
}

export interface ProbitGroup {
  points: readonly DosePoint[];
}

export interface ProbitGroupsResult {
  /** One intercept per group, in input order. */
  intercepts: number[];
  /** The slope common to all groups. */
  slope: number;
  /** Full covariance, parameters ordered intercepts…, slope. */
  covariance: Matrix;
  seIntercepts: number[];
  seSlope: number;
  deviance: number;
  logLikelihood: number;
  iterations: number;
  converged: boolean;
  warning: string | null;
}

function validatePoints(points: readonly DosePoint[], where: string): void {
  points.forEach((pt, i) => {
    assertFinite(pt.x, `${where}[${String(i)}].x`);
    assertSuccesses(pt.successes, pt.trials, `${where}[${String(i)}].successes`);
  });
}

type Direction = 'up' | 'down';

/**
 * Whether one group's points can be split by a threshold in x with all successes on one side and
 * all failures on the other (ties at the threshold allowed: quasi-complete separation).
 */
function separable(points: readonly DosePoint[], direction: Direction): boolean {
  const successX = points.filter((p) => p.successes > 0).map((p) => p.x);
  const failureX = points.filter((p) => p.successes < p.trials).map((p) => p.x);
  if (successX.length === 0 || failureX.length === 0) return true;
  return direction === 'up'
    ? Math.max(...failureX) <= Math.min(...successX)
    : Math.max(...successX) <= Math.min(...failureX);
}

/**
 * For the model Φ(a_g + b·x) the maximum-likelihood estimate is finite exactly when no
 * (a, b) ≠ 0 separates successes from failures: with b = 0 that means some group is all successes
 * or all failures; with b ≠ 0 it means every group is separable in the same direction.
 */
function separationWarning(groups: readonly (readonly DosePoint[])[]): string | null {
  const used = groups.map((g) => g.filter((p) => p.trials > 0));
  const oneSided = used.findIndex(
    (g) => g.every((p) => p.successes === p.trials) || g.every((p) => p.successes === 0),
  );
  if (oneSided >= 0) {
    return groups.length === 1
      ? 'every observation is 100% or every observation is 0%: the fit has no finite maximum'
      : `group ${String(oneSided)} is all 100% or all 0%: its intercept has no finite maximum`;
  }
  if (used.every((g) => separable(g, 'up')) || used.every((g) => separable(g, 'down'))) {
    return 'successes and failures are separated along x: the slope has no finite maximum';
  }
  return null;
}

function distinctX(points: readonly DosePoint[]): number {
  return new Set(points.filter((p) => p.trials > 0).map((p) => p.x)).size;
}

/**
 * Maximum-likelihood probit regression P(success) = Φ(a + b·x) for binomial counts (a binomial
 * GLM with probit link, fitted by Fisher scoring with step-halving). Safe at 0% and 100% points;
 * when the data allow no finite estimate (all-or-nothing or separated data), or the iterations do
 * not settle, `converged` is false and `warning` says why.
 */
export function probitRegression(points: readonly DosePoint[]): ProbitRegressionResult {
  validatePoints(points, 'points');
  if (distinctX(points) < 2)
    throw new RangeError('probit regression needs observations at two or more distinct x values');
  const rows: ProbitRow[] = points.map((p) => ({
    covariates: [1, p.x],
    offset: 0,
    successes: p.successes,
    trials: p.trials,
  }));
  const fit = fitProbitGlm(rows, 2);
  const [a = Number.NaN, b = Number.NaN] = fit.coefficients;
  const v = fit.covariance;
  const vaa = v[0]?.[0] ?? Number.NaN;
  const vab = v[0]?.[1] ?? Number.NaN;
  const vbb = v[1]?.[1] ?? Number.NaN;
  const separation = separationWarning([points]);
  const warning = separation ?? (fit.converged ? null : 'the iterations did not converge');
  return {
    intercept: a,
    slope: b,
    covariance: [
      [vaa, vab],
      [vab, vbb],
    ],
    seIntercept: Math.sqrt(vaa),
    seSlope: Math.sqrt(vbb),
    deviance: fit.deviance,
    logLikelihood: fit.logLikelihood,
    iterations: fit.iterations,
    converged: fit.converged && separation === null,
    warning,
  };
}

/**
 * Probit regression with one slope common to all groups and an intercept per group,
 * P = Φ(a_g + b·x) — e.g. several seed lots of one species sharing a rate of decline (the seed
 * viability equation's species-wide σ) while each keeps its own initial viability.
 */
export function probitRegressionGroups(groups: readonly ProbitGroup[]): ProbitGroupsResult {
  if (groups.length === 0) throw new RangeError('at least one group is needed');
  groups.forEach((g, i) => {
    validatePoints(g.points, `groups[${String(i)}].points`);
    if (!g.points.some((p) => p.trials > 0)) throw new RangeError(`groups[${String(i)}] has no observations`);
  });
  if (!groups.some((g) => distinctX(g.points) >= 2)) {
    throw new RangeError('a common slope needs some group observed at two or more distinct x values');
  }
  const k = groups.length;
  const rows: ProbitRow[] = groups.flatMap((g, gi) =>
    g.points.map((p) => ({
      covariates: [...Array.from({ length: k }, (_, j) => (j === gi ? 1 : 0)), p.x],
      offset: 0,
      successes: p.successes,
      trials: p.trials,
    })),
  );
  const fit = fitProbitGlm(rows, k + 1);
  const se = fit.covariance.map((row, i) => Math.sqrt(row[i] ?? Number.NaN));
  const separation = separationWarning(groups.map((g) => g.points));
  return {
    intercepts: fit.coefficients.slice(0, k),
    slope: fit.coefficients[k] ?? Number.NaN,
    covariance: fit.covariance,
    seIntercepts: se.slice(0, k),
    seSlope: se[k] ?? Number.NaN,
    deviance: fit.deviance,
    logLikelihood: fit.logLikelihood,
    iterations: fit.iterations,
    converged: fit.converged && separation === null,
    warning: separation ?? (fit.converged ? null : 'the iterations did not converge'),
  };
}
