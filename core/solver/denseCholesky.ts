/**
 * In-place Cholesky factorisation and solve for small dense symmetric positive definite
 * systems (row-major n x n). Allocation-free: callers own every array.
 */

/**
 * Factorise A = L L^T in place (lower triangle of `a` receives L).
 * Returns false when a pivot is not positive (A is not positive definite).
 * `pivots[i]` receives the squared diagonal of L before the square root, for conditioning checks.
 */
export function choleskyFactor(a: Float64Array, n: number, pivots?: Float64Array): boolean {
  for (let j = 0; j < n; j++) {
    let d = a[j * n + j];
    for (let k = 0; k < j; k++) {
      const l = a[j * n + k];
      d -= l * l;
    }
    if (pivots) pivots[j] = d;
    if (!(d > 0)) return false;
    const ljj = Math.sqrt(d);
    a[j * n + j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let s = a[i * n + j];
      for (let k = 0; k < j; k++) s -= a[i * n + k] * a[j * n + k];
      a[i * n + j] = s / ljj;
    }
  }
  return true;
}

/** Solve L L^T x = b with the factor from `choleskyFactor`; x may alias b. */
export function choleskySolve(l: Float64Array, n: number, b: Float64Array, x: Float64Array): void {
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let k = 0; k < i; k++) s -= l[i * n + k] * x[k];
    x[i] = s / l[i * n + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i];
    for (let k = i + 1; k < n; k++) s -= l[k * n + i] * x[k];
    x[i] = s / l[i * n + i];
  }
}
