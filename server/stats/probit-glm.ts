import { normalCdf, normalPdf, normalQuantile } from './distributions';
import { cholesky, choleskyInverse, choleskySolve } from './linear-algebra';
import type { Matrix } from './linear-algebra';

/** One binomial observation of the design: P(success) = Φ(offset + covariates·β). */
export interface ProbitRow {
  covariates: readonly number[];
  offset: number;
  successes: number;
  trials: number;
}

export interface ProbitFit {
  coefficients: number[];
  /** Inverse of the expected (Fisher) information at the estimate, as GLM software reports it. */
  covariance: Matrix;
  deviance: number;
  logLikelihood: number;
  iterations: number;
  converged: boolean;
}

// Working probabilities are kept this far from 0 and 1: the binomial weights and logs stay finite
// at 0% and 100% points. Φ (distributions.ts) keeps relative accuracy near 1e-14 well past
// Φ⁻¹(1e-10) ≈ −6.4, so the clamp, not the cdf, limits the tails.
const PROBABILITY_FLOOR = 1e-10;
const MAX_ITERATIONS = 100;
const MAX_HALVINGS = 30;

interface State {
  logLikelihood: number;
  score: number[];
  information: Matrix;
}

function linearPredictor(row: ProbitRow, beta: readonly number[]): number {
  return row.covariates.reduce((s, x, j) => s + x * (beta[j] ?? 0), row.offset);
}

function evaluate(rows: readonly ProbitRow[], beta: readonly number[]): State {
  const p = beta.length;
  const score = new Array<number>(p).fill(0);
  const information: Matrix = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  let logLikelihood = 0;
  for (const row of rows) {
    const eta = linearPredictor(row, beta);
    const mu = Math.max(PROBABILITY_FLOOR, normalCdf(eta));
    const nu = Math.max(PROBABILITY_FLOOR, normalCdf(-eta)); // 1 − μ without cancellation
    const density = normalPdf(eta);
    const failures = row.trials - row.successes;
    logLikelihood += row.successes * Math.log(mu) + failures * Math.log(nu);
    // d ℓ / d η and the expected information weight n φ² / (μ(1 − μ)).
    const gradient = (row.successes * density) / mu - (failures * density) / nu;
    const weight = (row.trials * density * density) / (mu * nu);
    row.covariates.forEach((xj, j) => {
      score[j] = (score[j] ?? 0) + gradient * xj;
      const infoRow = information[j];
      if (infoRow === undefined) return;
      row.covariates.forEach((xk, k) => {
        infoRow[k] = (infoRow[k] ?? 0) + weight * xj * xk;
      });
    });
  }
  return { logLikelihood, score, information };
}

function deviance(rows: readonly ProbitRow[], beta: readonly number[]): number {
  let total = 0;
  for (const row of rows) {
    const eta = linearPredictor(row, beta);
    const mu = Math.max(PROBABILITY_FLOOR, normalCdf(eta));
    const nu = Math.max(PROBABILITY_FLOOR, normalCdf(-eta));
    const failures = row.trials - row.successes;
    if (row.successes > 0) total += row.successes * Math.log(row.successes / (row.trials * mu));
    if (failures > 0) total += failures * Math.log(failures / (row.trials * nu));
  }
  return 2 * total;
}

/**
 * Starting values: weighted least squares of the empirical probits Φ⁻¹((y + ½)/(n + 1)), a
 * common practice that is finite at 0% and 100%. Throws when the design does not identify β.
 */
function startingValues(rows: readonly ProbitRow[], p: number): number[] {
  const xtx: Matrix = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  const xtz = new Array<number>(p).fill(0);
  for (const row of rows) {
    const z = normalQuantile((row.successes + 0.5) / (row.trials + 1)) - row.offset;
    row.covariates.forEach((xj, j) => {
      xtz[j] = (xtz[j] ?? 0) + row.trials * xj * z;
      const r = xtx[j];
      if (r === undefined) return;
      row.covariates.forEach((xk, k) => {
        r[k] = (r[k] ?? 0) + row.trials * xj * xk;
      });
    });
  }
  const l = cholesky(xtx);
  if (l === null)
    throw new RangeError('the data do not determine the probit parameters (too few distinct points)');
  return choleskySolve(l, xtz);
}

/**
 * Maximum-likelihood binomial GLM with probit link by Fisher scoring (iteratively reweighted
 * least squares) with step-halving on the log-likelihood. Stops when the step and the change in
 * log-likelihood are both negligible; `converged: false` when that does not happen within the
 * iteration limit or the information matrix becomes singular (e.g. perfectly separated data, whose
 * estimates run off to infinity).
 */
export function fitProbitGlm(rows: readonly ProbitRow[], parameterCount: number): ProbitFit {
  const used = rows.filter((r) => r.trials > 0);
  let beta = startingValues(used, parameterCount);
  let state = evaluate(used, beta);
  let converged = false;
  let iterations = 0;
  while (iterations < MAX_ITERATIONS) {
    iterations += 1;
    const l = cholesky(state.information);
    if (l === null) break;
    let step = choleskySolve(l, state.score);
    let candidate = beta.map((b, j) => b + (step[j] ?? 0));
    let next = evaluate(used, candidate);
    for (
      let h = 0;
      h < MAX_HALVINGS &&
      !(next.logLikelihood >= state.logLikelihood - 1e-12 * Math.abs(state.logLikelihood));
      h++
    ) {
      step = step.map((s) => s / 2);
      candidate = beta.map((b, j) => b + (step[j] ?? 0));
      next = evaluate(used, candidate);
    }
    const smallStep = step.every((s, j) => Math.abs(s) <= 1e-9 * (1 + Math.abs(candidate[j] ?? 0)));
    const smallGain =
      Math.abs(next.logLikelihood - state.logLikelihood) <= 1e-12 * (1 + Math.abs(next.logLikelihood));
    beta = candidate;
    state = next;
    if (smallStep && smallGain) {
      converged = true;
      break;
    }
  }
  const l = cholesky(state.information);
  const covariance: Matrix =
    l === null
      ? Array.from({ length: parameterCount }, () => new Array<number>(parameterCount).fill(Number.NaN))
      : choleskyInverse(l);
  return {
    coefficients: beta,
    covariance,
    deviance: deviance(used, beta),
    logLikelihood: state.logLikelihood,
    iterations,
    converged: converged && l !== null,
  };
}
