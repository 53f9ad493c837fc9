import { normalCdf, normalPdf } from './distributions';
import type { ProbitGroup } from './probit-regression';

/**
 * Probit regression with one intercept per group and a slope common to all groups (the pooled
 * decline of a species' lots), by Fisher scoring. The information matrix has an "arrow" shape —
 * diagonal in the intercepts plus one slope row and column — so each step is solved through the
 * Schur complement of the slope in O(observations) instead of inverting a (k+1)×(k+1) matrix.
 * Same model and estimates as probitRegressionGroups (which the tests use as the reference), for
 * banks with hundreds of lots of one species.
 */
export interface CommonSlopeFit {
  intercepts: number[];
  slope: number;
  seIntercepts: number[];
  seSlope: number;
  deviance: number;
  iterations: number;
  converged: boolean;
}

const EPS = 1e-10;
const clampP = (p: number) => Math.min(1 - EPS, Math.max(EPS, p));

function deviance(groups: readonly ProbitGroup[], alpha: number[], beta: number): number {
  let d = 0;
  groups.forEach((g, gi) => {
    for (const pt of g.points) {
      if (pt.trials === 0) continue;
      const mu = clampP(normalCdf(alpha[gi]! + beta * pt.x));
      const y = pt.successes;
      const n = pt.trials;
      if (y > 0) d += 2 * y * Math.log(y / (n * mu));
      if (n - y > 0) d += 2 * (n - y) * Math.log((n - y) / (n * (1 - mu)));
    }
  });
  return d;
}

export function commonSlopeProbit(groups: readonly ProbitGroup[], maxIterations = 100): CommonSlopeFit {
  if (groups.length === 0) throw new RangeError('at least one group is needed');
  const k = groups.length;
  // Start from each group's pooled proportion and a flat slope.
  let alpha = groups.map((g) => {
    const n = g.points.reduce((s, p) => s + p.trials, 0);
    const y = g.points.reduce((s, p) => s + p.successes, 0);
    if (n === 0) throw new RangeError('a group has no observations');
    return Math.max(-5, Math.min(5, invNormalApprox((y + 0.5) / (n + 1))));
  });
  let beta = 0;
  let dev = deviance(groups, alpha, beta);
  let converged = false;
  let iterations = 0;
  let D: number[] = [];
  let b: number[] = [];
  let schur = Number.NaN;
  for (; iterations < maxIterations; iterations++) {
    D = new Array<number>(k).fill(0);
    b = new Array<number>(k).fill(0);
    const r = new Array<number>(k).fill(0);
    let c = 0;
    let rBeta = 0;
    groups.forEach((g, gi) => {
      for (const pt of g.points) {
        if (pt.trials === 0) continue;
        const eta = alpha[gi]! + beta * pt.x;
        const mu = clampP(normalCdf(eta));
        const dens = Math.max(normalPdf(eta), 1e-300);
        const w = (pt.trials * dens * dens) / (mu * (1 - mu));
        const z = eta + (pt.successes / pt.trials - mu) / dens;
        D[gi]! += w;
        b[gi]! += w * pt.x;
        r[gi]! += w * z;
        c += w * pt.x * pt.x;
        rBeta += w * pt.x * z;
      }
    });
    let sumBB = 0;
    let sumBR = 0;
    for (let g = 0; g < k; g++) {
      sumBB += (b[g]! * b[g]!) / D[g]!;
      sumBR += (b[g]! * r[g]!) / D[g]!;
    }
    schur = c - sumBB;
    if (!(schur > 0))
      throw new RangeError('a common slope needs some group observed at two or more distinct x values');
    const nextBeta = (rBeta - sumBR) / schur;
    const nextAlpha = alpha.map((_, g) => (r[g]! - b[g]! * nextBeta) / D[g]!);
    // Step-halving keeps the deviance from rising (safe near 0% and 100% points).
    let step = 1;
    let candAlpha = nextAlpha;
    let candBeta = nextBeta;
    let candDev = deviance(groups, candAlpha, candBeta);
    while (candDev > dev + 1e-9 && step > 1 / 1024) {
      step /= 2;
      candAlpha = alpha.map((a, g) => a + step * (nextAlpha[g]! - a));
      candBeta = beta + step * (nextBeta - beta);
      candDev = deviance(groups, candAlpha, candBeta);
    }
    const change = Math.abs(candDev - dev);
    alpha = candAlpha;
    beta = candBeta;
    dev = candDev;
    if (change < 1e-9 * (Math.abs(dev) + 0.1)) {
      converged = true;
      iterations++;
      break;
    }
  }
  // Inverse of the arrow matrix: Var(β) = 1/S, Var(α_g) = 1/D_g + (b_g/D_g)²/S.
  return {
    intercepts: alpha,
    slope: beta,
    seSlope: Math.sqrt(1 / schur),
    seIntercepts: alpha.map((_, g) => Math.sqrt(1 / D[g]! + (b[g]! / D[g]!) ** 2 / schur)),
    deviance: dev,
    iterations,
    converged,
  };
}

/** A rough inverse normal for starting values only (logit-scaled; exactness does not matter). */
function invNormalApprox(p: number): number {
  return Math.log(p / (1 - p)) / 1.702;
}
