import fc from 'fast-check';
import jStat from 'jstat';
import { chiSquaredDistributionTable } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import {
  betaQuantile,
  chiSquareCdf,
  chiSquareUpperTail,
  normalCdf,
  normalPdf,
  normalQuantile,
  twoSidedZ,
} from '#server/stats/distributions';
import {
  inverseRegularizedBeta,
  regularizedBeta,
  regularizedGammaP,
  regularizedGammaQ,
} from '#server/stats/special-functions';

// Reference library: jstat 1.9.6 (npm). It is accurate only in part of the range, so each cross-check
// below is run where jstat itself holds the stated accuracy, and the rest of the range is checked
// against closed forms and published expansions. Where jstat is weak, from its source:
// - normal cdf: erfc by a Chebyshev series, relative accuracy fades below z ≈ −5;
// - normal quantile: erfcinv with two Newton steps, good to ~1e-9 relative for tails ≥ 1e-9 only;
// - chi-square: its gammaln (Numerical Recipes 2nd ed., ~2e-10) and a fixed number of continued-
//   fraction steps; the upper tail is formed as 1 − cdf, so it loses relative accuracy below ~1e-6;
// - incomplete beta: its continued fraction stops at a relative change of 3e-7, so jstat.ibeta and
//   jstat.beta.inv agree with any accurate method only to a few parts in 1e-7.

function relative(actual: number, expected: number): number {
  return actual === expected ? 0 : Math.abs(actual - expected) / Math.abs(expected);
}

/** Runs `check` over points and returns the worst relative error with the point where it occurred. */
function worst<T>(
  points: readonly T[],
  check: (point: T) => [number, number] | null,
): { error: number; at: T | null } {
  let error = 0;
  let at: T | null = null;
  for (const point of points) {
    const pair = check(point);
    if (pair === null) continue;
    const e = relative(pair[0], pair[1]);
    if (!(e <= error)) {
      error = e;
      at = point;
    }
  }
  return { error, at };
}

function range(from: number, to: number, step: number): number[] {
  const out: number[] = [];
  for (let i = 0; from + i * step <= to + 1e-12; i++) out.push(from + i * step);
  return out;
}

/** ln n! by adding logarithms (an independent check on the Lanczos log-gamma). */
const LOG_FACTORIAL = [0];
for (let k = 1; k <= 1000; k++) LOG_FACTORIAL.push((LOG_FACTORIAL[k - 1] ?? 0) + Math.log(k));
function logFactorial(n: number): number {
  const v = LOG_FACTORIAL[n];
  if (v === undefined) throw new Error('n too large for the test table');
  return v;
}

/** I_x(a, b) for whole a, b: P(Binomial(a + b − 1, x) ≥ a) (A&S 26.5.24 / 6.6.4; the binomial relation). */
function binomialFormBeta(x: number, a: number, b: number): number {
  const n = a + b - 1;
  let total = 0;
  for (let j = a; j <= n; j++) {
    total += Math.exp(
      logFactorial(n) - logFactorial(j) - logFactorial(n - j) + j * Math.log(x) + (n - j) * Math.log1p(-x),
    );
  }
  return total;
}

/** Q(x) = 1 − Φ(x), x ≥ 2, by Laplace's continued fraction (A&S 26.2.14), evaluated bottom-up. */
function laplaceUpperTail(x: number): number {
  let t = x;
  for (let k = 4000; k >= 1; k--) t = x + k / t;
  return Math.exp((-x * x) / 2) / Math.sqrt(2 * Math.PI) / t;
}

/** Q(x) for large x by the asymptotic series φ(x)/x · Σ (−1)ᵏ (2k − 1)!!/x²ᵏ (A&S 26.2.12), cut at its smallest term. */
function asymptoticUpperTail(x: number): number {
  let term = 1;
  let total = 1;
  for (let k = 1; k < 1000; k++) {
    const next = (-term * (2 * k - 1)) / (x * x);
    if (Math.abs(next) >= Math.abs(term) || Math.abs(next) < 1e-18) break;
    term = next;
    total += term;
  }
  return (Math.exp((-x * x) / 2) / (Math.sqrt(2 * Math.PI) * x)) * total;
}

/** Q(χ² | 2k) = e^(−x/2) Σ_{r<k} (x/2)ʳ/r!, the chi-square–Poisson relation for even df (A&S 26.4.21, number from memory). */
function evenDfUpperTail(x: number, df: number): number {
  const m = x / 2;
  let term = 1;
  let total = 1;
  for (let r = 1; r < df / 2; r++) {
    term *= m / r;
    total += term;
  }
  return Math.exp(-m) * total;
}

describe('normalCdf', () => {
  it('when z is from −5 to 8, then it agrees with jstat to 1e-9 relative on a grid and at random points', () => {
    // jstat normal cdf (erfc-based) holds ~5e-11 relative in this range.
    const grid = worst(range(-5, 8, 0.01), (z) => [normalCdf(z), jStat.normal.cdf(z, 0, 1)]);
    expect(grid.error, `worst at z = ${String(grid.at)}`).toBeLessThan(1e-9);
    fc.assert(
      fc.property(fc.double({ min: -5, max: 8, noNaN: true }), (z) => {
        expect(relative(normalCdf(z), jStat.normal.cdf(z, 0, 1))).toBeLessThan(1e-9);
      }),
      { numRuns: 500, seed: 42 },
    );
  });

  it('when z is far in the lower tail, then it matches Laplace’s continued fraction to 1e-12 relative', () => {
    // A&S 26.2.14 (Laplace's continued fraction for the Mills ratio), down to Φ ≈ 1e-300.
    const tail = worst(range(2, 37, 0.01), (x) => [normalCdf(-x), laplaceUpperTail(x)]);
    expect(tail.error, `worst at x = ${String(tail.at)}`).toBeLessThan(1e-12);
    // A&S 26.2.12 (asymptotic series), valid far out: an independent second form.
    const asymptotic = worst(range(10, 37, 0.05), (x) => [normalCdf(-x), asymptoticUpperTail(x)]);
    expect(asymptotic.error, `worst at x = ${String(asymptotic.at)}`).toBeLessThan(1e-12);
  });

  it('when z is at the probit regression clamp Φ⁻¹(1e-10), then Φ is accurate where jstat is not', () => {
    // The probit fit clamps probabilities at 1e-10 (z ≈ −6.36); Laplace's continued fraction (A&S 26.2.14).
    const z = -6.361340902404056;
    expect(relative(normalCdf(z), laplaceUpperTail(-z))).toBeLessThan(1e-13);
    expect(relative(normalCdf(z), 1e-10)).toBeLessThan(1e-8); // z is Φ⁻¹(1e-10) to the digits given (from memory)
  });

  it('when mirrored, then Φ(z) + Φ(−z) = 1 and the ends are 0 and 1', () => {
    // Symmetry of the normal distribution.
    for (const z of range(-8, 8, 0.125)) expect(normalCdf(z) + normalCdf(-z)).toBeCloseTo(1, 15);
    expect(normalCdf(Number.NEGATIVE_INFINITY)).toBe(0);
    expect(normalCdf(Number.POSITIVE_INFINITY)).toBe(1);
    expect(normalCdf(0)).toBe(0.5);
    expect(normalCdf(Number.NaN)).toBeNaN();
  });
});

describe('normalPdf', () => {
  it('when evaluated over a grid, then it agrees with jstat to 1e-13 relative', () => {
    // Both round z² before exp(−z²/2); at |z| = 30 that alone is ~1e-13 of relative spread.
    const grid = worst(range(-30, 30, 0.05), (z) => [normalPdf(z), jStat.normal.pdf(z, 0, 1)]);
    expect(grid.error, `worst at z = ${String(grid.at)}`).toBeLessThan(1e-13);
  });
});

describe('normalQuantile', () => {
  const tails = range(-10, -0.31, 0.05).map((e) => 10 ** e);

  it('when p is from 1e-10 to 1 − 1e-10, then it agrees with jstat within jstat’s own accuracy', () => {
    // jstat's inverse holds ~1e-9 relative for tails ≥ 1e-9 and ~5e-9 in the decade below (its erfcinv).
    for (const tail of tails) {
      const tolerance = tail >= 1e-9 ? 1e-9 : 1e-8;
      expect(
        relative(normalQuantile(tail), jStat.normal.inv(tail, 0, 1)),
        `p = ${String(tail)}`,
      ).toBeLessThan(tolerance);
      const p = 1 - tail;
      expect(relative(normalQuantile(p), jStat.normal.inv(p, 0, 1)), `p = ${String(p)}`).toBeLessThan(
        tolerance,
      );
    }
  });

  it('when p is random, then jstat’s cdf maps the quantile back to p', () => {
    // jstat's cdf is accurate to ~5e-11 for z ≥ −5 (p ≥ 3e-7); the slope factor z²·… keeps this under 1e-9.
    fc.assert(
      fc.property(fc.double({ min: 3e-7, max: 1 - 3e-7, noNaN: true }), (p) => {
        const z = normalQuantile(p);
        const back = p <= 0.5 ? jStat.normal.cdf(z, 0, 1) : 1 - jStat.normal.cdf(z, 0, 1);
        expect(relative(back, p <= 0.5 ? p : 1 - p)).toBeLessThan(1e-9);
      }),
      { numRuns: 500, seed: 42 },
    );
  });

  it('when p is as small as 1e-300, then Φ(Φ⁻¹(p)) returns p to 3e-14 (1e-12 past 1e-20) relative', () => {
    // Round trip through normalCdf, itself checked above against A&S 26.2.14. Far out, rounding in
    // exp(−z²/2) (z² up to ~1400) bounds the relative accuracy near 1e-13.
    const small = range(-300, -0.31, 0.1).map((e) => 10 ** e);
    for (const p of small) {
      const tolerance = p >= 1e-20 ? 3e-14 : 1e-12;
      expect(relative(normalCdf(normalQuantile(p)), p), `p = ${String(p)}`).toBeLessThan(tolerance);
      const tail = 1 - (1 - p); // the upper-tail probability actually represented by 1 − p
      if (tail > 0)
        expect(relative(normalCdf(-normalQuantile(1 - p)), tail), `1 − ${String(p)}`).toBeLessThan(tolerance);
    }
  });

  it('when p is a usual confidence point, then it gives the familiar critical values', () => {
    // Standard normal critical values, from memory, to 15 significant digits; also jstat.
    expect(twoSidedZ(0.95)).toBeCloseTo(1.95996398454005, 13);
    expect(normalQuantile(0.95)).toBeCloseTo(1.64485362695147, 13);
    expect(twoSidedZ(0.99)).toBeCloseTo(2.5758293035489, 13);
    expect(twoSidedZ(0.9)).toBeCloseTo(jStat.normal.inv(0.95, 0, 1), 13);
  });

  it('when p is 0, 1, ½ or outside [0, 1], then it returns ∓∞, 0 or NaN', () => {
    expect(normalQuantile(0)).toBe(Number.NEGATIVE_INFINITY);
    expect(normalQuantile(1)).toBe(Number.POSITIVE_INFINITY);
    expect(normalQuantile(0.5)).toBe(0);
    expect(normalQuantile(-0.1)).toBeNaN();
    expect(normalQuantile(1.1)).toBeNaN();
    expect(normalQuantile(Number.NaN)).toBeNaN();
  });
});

describe('chi-square distribution (regularized incomplete gamma)', () => {
  const dfs = [...range(1, 30, 1), 40, 50, 70, 100];
  const xs: number[] = [];
  for (let x = 0.01; x < 400; x *= 1.15) xs.push(x);
  const points = dfs.flatMap((df) => xs.map((x) => [x, df] as const));

  it('when the upper tail is at least 1e-6, then it agrees with 1 − jstat’s cdf to 1e-9 relative', () => {
    const upper = worst(points, ([x, df]) => {
      const reference = 1 - jStat.chisquare.cdf(x, df);
      return reference >= 1e-6 ? [chiSquareUpperTail(x, df), reference] : null;
    });
    expect(upper.error, `worst at ${JSON.stringify(upper.at)}`).toBeLessThan(1e-9);
  });

  it('when the cdf is compared with jstat, then they agree to 1e-9 relative wherever the cdf is representable', () => {
    const lower = worst(points, ([x, df]) => {
      const reference = jStat.chisquare.cdf(x, df);
      return reference > 1e-300 ? [chiSquareCdf(x, df), reference] : null;
    });
    expect(lower.error, `worst at ${JSON.stringify(lower.at)}`).toBeLessThan(1e-9);
  });

  it('when df is even, then the upper tail matches the Poisson sum to 1e-12 relative, deep into the tail', () => {
    // Q(χ²|2k) = e^(−x/2) Σ_{r<k} (x/2)ʳ/r! (A&S 26.4.21, number from memory); down to ~1e-290.
    const even = [2, 4, 6, 10, 20, 40].flatMap((df) => range(0.5, 1300, 2.5).map((x) => [x, df] as const));
    const tail = worst(even, ([x, df]) => {
      const reference = evenDfUpperTail(x, df);
      return reference > 1e-290 ? [chiSquareUpperTail(x, df), reference] : null;
    });
    expect(tail.error, `worst at ${JSON.stringify(tail.at)}`).toBeLessThan(1e-12);
  });

  it('when df is 1, then the upper tail is 2Φ(−√x) by Laplace’s continued fraction', () => {
    // χ²₁ = Z² (definition); Q(z) from A&S 26.2.14.
    const one = worst(range(4, 1300, 1.5), (x) => [
      chiSquareUpperTail(x, 1),
      2 * laplaceUpperTail(Math.sqrt(x)),
    ]);
    expect(one.error, `worst at x = ${String(one.at)}`).toBeLessThan(1e-12);
  });

  it('when compared with the printed percentage points, then every entry is the quantile to within 0.01', () => {
    // simple-statistics' chiSquaredDistributionTable: Hines & Montgomery (1980), App. 1, Table III, keyed by
    // upper-tail probability. A few entries are one unit off in the last decimal (the table's rounding),
    // so the check allows ±0.01: the tail at v − 0.01 is above p and at v + 0.01 below it.
    const levels = [0.995, 0.99, 0.975, 0.95, 0.9, 0.5, 0.1, 0.05, 0.025, 0.01, 0.005] as const;
    let entries = 0;
    for (const [dfKey, row] of Object.entries(chiSquaredDistributionTable)) {
      const df = Number(dfKey);
      for (const p of levels) {
        const value = row[p];
        const below = value - 0.01 <= 0 ? 1 : chiSquareUpperTail(value - 0.01, df);
        expect(chiSquareUpperTail(value + 0.01, df), `df ${dfKey}, p ${String(p)}`).toBeLessThan(p);
        expect(below, `df ${dfKey}, p ${String(p)}`).toBeGreaterThan(p);
        entries += 1;
      }
    }
    expect(entries).toBe(37 * 11);
  });

  it('when P and Q are added, then they make 1, and the ends are exact', () => {
    // P(a, x) + Q(a, x) = 1 (definition of the regularized incomplete gamma functions).
    for (const a of [0.5, 1, 2.5, 10, 60]) {
      for (const x of [0.1, 1, 3, 11, 59, 61, 120]) {
        expect(regularizedGammaP(a, x) + regularizedGammaQ(a, x)).toBeCloseTo(1, 14);
      }
    }
    expect(chiSquareUpperTail(0, 3)).toBe(1);
    expect(chiSquareCdf(0, 3)).toBe(0);
    expect(regularizedGammaQ(2, Number.POSITIVE_INFINITY)).toBe(0);
    // P(1, x) = 1 − e^(−x) (the exponential distribution).
    expect(relative(regularizedGammaP(1, 1e-3), -Math.expm1(-1e-3))).toBeLessThan(1e-14);
    expect(() => regularizedGammaP(0, 1)).toThrow(RangeError);
    expect(() => regularizedGammaQ(1, -1)).toThrow(RangeError);
  });
});

describe('regularized incomplete beta', () => {
  const shapes = [0.5, 1, 2, 5, 10, 30, 81, 183, 300];
  const xs = range(0.0005, 0.9995, 0.0123);

  it('when compared with jstat over a grid of shapes, then they agree within jstat’s 3e-7 stopping rule', () => {
    const points = shapes.flatMap((a) => shapes.flatMap((b) => xs.map((x) => [x, a, b] as const)));
    const grid = worst(points, ([x, a, b]) => {
      const reference = jStat.ibeta(x, a, b);
      return reference >= 1e-10 ? [regularizedBeta(x, a, b), reference] : null;
    });
    expect(grid.error, `worst at ${JSON.stringify(grid.at)}`).toBeLessThan(5e-7);
  });

  it('when the shapes are whole numbers, then it equals the binomial tail sum to 1e-11 relative', () => {
    // I_x(a, b) = P(Binomial(a + b − 1, x) ≥ a) (A&S 26.5.24), summed with log-factorials by addition.
    // The log-gamma terms of ln B(a, b) reach ~2000 here, so ~1e-12 of cancellation is expected.
    const whole = [1, 2, 3, 7, 20, 81, 183, 400];
    const points = whole.flatMap((a) => whole.flatMap((b) => xs.map((x) => [x, a, b] as const)));
    const grid = worst(points, ([x, a, b]) => {
      const reference = binomialFormBeta(x, a, b);
      return reference > 1e-280 ? [regularizedBeta(x, a, b), reference] : null;
    });
    expect(grid.error, `worst at ${JSON.stringify(grid.at)}`).toBeLessThan(1e-11);
  });

  it('when a or b is 1 or both are ½, then it matches the closed forms', () => {
    // I_x(a, 1) = xᵃ; I_x(1, b) = 1 − (1 − x)ᵇ; I_x(½, ½) = (2/π) arcsin √x (the arcsine law).
    for (const x of xs) {
      for (const s of [0.5, 3, 250.5, 1999]) {
        expect(relative(regularizedBeta(x, s, 1), x ** s)).toBeLessThan(1e-11);
        expect(relative(regularizedBeta(x, 1, s), -Math.expm1(s * Math.log1p(-x)))).toBeLessThan(1e-11);
      }
      expect(relative(regularizedBeta(x, 0.5, 0.5), (2 / Math.PI) * Math.asin(Math.sqrt(x)))).toBeLessThan(
        1e-13,
      );
    }
  });

  it('when mirrored, then I_x(a, b) + I_{1−x}(b, a) = 1', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-6, max: 1 - 1e-6, noNaN: true }),
        fc.double({ min: 0.5, max: 3000, noNaN: true }),
        fc.double({ min: 0.5, max: 3000, noNaN: true }),
        (x, a, b) => {
          expect(regularizedBeta(x, a, b) + regularizedBeta(1 - x, b, a)).toBeCloseTo(1, 12);
        },
      ),
      { numRuns: 200, seed: 42 },
    );
  });

  it('when the arguments are outside the domain, then the ends are 0 and 1 and bad shapes throw', () => {
    expect(regularizedBeta(0, 2, 3)).toBe(0);
    expect(regularizedBeta(1, 2, 3)).toBe(1);
    expect(() => regularizedBeta(0.5, 0, 3)).toThrow(RangeError);
    expect(() => regularizedBeta(0.5, 2, -1)).toThrow(RangeError);
  });
});

describe('betaQuantile (inverse regularized incomplete beta)', () => {
  const shapes = [0.5, 1, 2, 5, 10, 30, 81, 183, 300, 2000];

  it('when compared with jstat for p from 1e-5 to 0.9995, then they agree within jstat’s accuracy', () => {
    const ps = [1e-5, 0.0005, 0.005, 0.025, 0.1, 0.3, 0.5, 0.7, 0.9, 0.975, 0.995, 0.9995];
    const points = shapes.flatMap((a) => shapes.flatMap((b) => ps.map((p) => [p, a, b] as const)));
    const grid = worst(points, ([p, a, b]) => [betaQuantile(p, a, b), jStat.beta.inv(p, a, b)]);
    expect(grid.error, `worst at ${JSON.stringify(grid.at)}`).toBeLessThan(5e-7);
  });

  it('when a or b is 1 or both are ½, then it matches the closed-form quantiles to 1e-11 relative', () => {
    // Inverting I_x(a, 1) = xᵃ, I_x(1, b) = 1 − (1 − x)ᵇ and I_x(½, ½) = (2/π) arcsin √x.
    for (const e of range(-12, -0.01, 0.25)) {
      const p = 10 ** e;
      for (const s of [0.5, 3, 250.5, 1999]) {
        expect(relative(betaQuantile(p, s, 1), p ** (1 / s)), `p ${String(p)}, a ${String(s)}`).toBeLessThan(
          1e-11,
        );
        expect(
          relative(betaQuantile(p, 1, s), -Math.expm1(Math.log1p(-p) / s)),
          `p ${String(p)}, b ${String(s)}`,
        ).toBeLessThan(1e-11);
        const q = 1 - p;
        expect(
          relative(betaQuantile(q, 1, s), -Math.expm1(Math.log1p(-q) / s)),
          `p ${String(q)}, b ${String(s)}`,
        ).toBeLessThan(1e-11);
      }
      expect(relative(betaQuantile(p, 0.5, 0.5), Math.sin((Math.PI * p) / 2) ** 2)).toBeLessThan(1e-11);
    }
  });

  it('when p and the shapes are random, then the quantile is within 1e-12 of x (or of 1 − x) of the root', () => {
    // The residual of the beta cdf divided by the density is the error in x (Newton's estimate); the
    // density is jstat's. Next to 1 the spacing of floating-point numbers (1.1e-16) sets a floor of two
    // spacings.
    fc.assert(
      fc.property(
        fc.double({ min: 1e-10, max: 1 - 1e-10, noNaN: true }),
        fc.double({ min: 0.5, max: 2500, noNaN: true }),
        fc.double({ min: 0.5, max: 2500, noNaN: true }),
        (p, a, b) => {
          const x = inverseRegularizedBeta(p, a, b);
          const residual = p <= 0.5 ? regularizedBeta(x, a, b) - p : 1 - p - regularizedBeta(1 - x, b, a);
          const error = Math.abs(residual) / jStat.beta.pdf(x, a, b);
          expect(error).toBeLessThanOrEqual(1e-12 * Math.min(x, 1 - x) + 2.3e-16);
        },
      ),
      { numRuns: 300, seed: 42 },
    );
  });

  it('when p is 0 or 1 or outside, then it returns the ends or throws', () => {
    expect(betaQuantile(0, 2, 3)).toBe(0);
    expect(betaQuantile(1, 2, 3)).toBe(1);
    expect(() => betaQuantile(-0.1, 2, 3)).toThrow(RangeError);
    expect(() => betaQuantile(Number.NaN, 2, 3)).toThrow(RangeError);
  });
});
