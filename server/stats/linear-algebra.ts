// Small dense symmetric systems (a handful of parameters), solved by Cholesky decomposition.

export type Matrix = number[][];

function at(m: Matrix, i: number, j: number): number {
  return m[i]?.[j] ?? 0;
}

/** Lower-triangular L with A = L·Lᵀ, or null when A is not (numerically) positive definite. */
export function cholesky(a: Matrix): Matrix | null {
  const n = a.length;
  const l: Matrix = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let j = 0; j < n; j++) {
    let diagonal = at(a, j, j);
    for (let k = 0; k < j; k++) diagonal -= at(l, j, k) ** 2;
    if (!(diagonal > 1e-14 * Math.max(1, Math.abs(at(a, j, j))))) return null;
    const root = Math.sqrt(diagonal);
    const row = l[j];
    if (row === undefined) return null;
    row[j] = root;
    for (let i = j + 1; i < n; i++) {
      let s = at(a, i, j);
      for (let k = 0; k < j; k++) s -= at(l, i, k) * at(l, j, k);
      const target = l[i];
      if (target !== undefined) target[j] = s / root;
    }
  }
  return l;
}

/** Solves L·Lᵀ x = b. */
export function choleskySolve(l: Matrix, b: readonly number[]): number[] {
  const n = l.length;
  const y = new Array<number>(n).fill(0);
  for (let i = 0; i < n; i++) {
    let s = b[i] ?? 0;
    for (let k = 0; k < i; k++) s -= at(l, i, k) * (y[k] ?? 0);
    y[i] = s / at(l, i, i);
  }
  const x = new Array<number>(n).fill(0);
  for (let i = n - 1; i >= 0; i--) {
    let s = y[i] ?? 0;
    for (let k = i + 1; k < n; k++) s -= at(l, k, i) * (x[k] ?? 0);
    x[i] = s / at(l, i, i);
  }
  return x;
}

/** Inverse of a symmetric positive-definite matrix from its Cholesky factor. */
export function choleskyInverse(l: Matrix): Matrix {
  const n = l.length;
  const columns = Array.from({ length: n }, (_, j) =>
    choleskySolve(
      l,
      Array.from({ length: n }, (_, i) => (i === j ? 1 : 0)),
    ),
  );
  // columns[j] is column j of the inverse; symmetrise against rounding.
  return Array.from({ length: n }, (_, i) =>
    Array.from({ length: n }, (_, j) => ((columns[j]?.[i] ?? 0) + (columns[i]?.[j] ?? 0)) / 2),
  );
}
