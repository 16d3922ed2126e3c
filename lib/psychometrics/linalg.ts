// Dense symmetric solves for the small (≤ a dozen parameters) Fisher-scoring systems.

/**
 * Solves A x = b for symmetric positive-definite A (n×n, row-major) by Cholesky, in place
 * on copies held in `work` (length n*n). Returns false when A is not positive definite.
 */
export function choleskySolve(a: Float64Array, b: Float64Array, n: number, x: Float64Array, work: Float64Array): boolean {
  for (let i = 0; i < n * n; i++) work[i] = a[i];
  for (let j = 0; j < n; j++) {
    let s = work[j * n + j];
    for (let k = 0; k < j; k++) s -= work[j * n + k] * work[j * n + k];
    if (!(s > 0)) return false;
    const d = Math.sqrt(s);
    work[j * n + j] = d;
    for (let i = j + 1; i < n; i++) {
      let t = work[i * n + j];
      for (let k = 0; k < j; k++) t -= work[i * n + k] * work[j * n + k];
      work[i * n + j] = t / d;
    }
  }
  for (let i = 0; i < n; i++) {
    let t = b[i];
    for (let k = 0; k < i; k++) t -= work[i * n + k] * x[k];
    x[i] = t / work[i * n + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let t = x[i];
    for (let k = i + 1; k < n; k++) t -= work[k * n + i] * x[k];
    x[i] = t / work[i * n + i];
  }
  return true;
}

/** Inverse of a symmetric positive-definite matrix, or null when singular. */
export function invertSpd(a: Float64Array, n: number): Float64Array | null {
  const inv = new Float64Array(n * n);
  const e = new Float64Array(n);
  const col = new Float64Array(n);
  const work = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    e.fill(0);
    e[j] = 1;
    if (!choleskySolve(a, e, n, col, work)) return null;
    for (let i = 0; i < n; i++) inv[i * n + j] = col[i];
  }
  return inv;
}
