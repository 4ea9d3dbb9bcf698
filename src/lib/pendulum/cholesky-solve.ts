// A small dense symmetric positive-definite solve, for the Levenberg–Marquardt step of fitDampedCosine.

/**
 * Solves the n×n symmetric positive-definite system m·x = b (m row-major, overwritten by its Cholesky
 * factor) by Cholesky factorisation and two triangular solves; false when m is not positive definite.
 */
export function choleskySolve(m: Float64Array, b: Float64Array, x: Float64Array, n: number): boolean {
  for (let j = 0; j < n; j++) {
    let d = m[j * n + j];
    for (let k = 0; k < j; k++) d -= m[j * n + k] * m[j * n + k];
    if (!(d > 0)) return false;
    const l = Math.sqrt(d);
    m[j * n + j] = l;
    for (let i = j + 1; i < n; i++) {
      let s = m[i * n + j];
      for (let k = 0; k < j; k++) s -= m[i * n + k] * m[j * n + k];
      m[i * n + j] = s / l;
    }
  }
  for (let i = 0; i < n; i++) {
    let s = b[i];
    for (let k = 0; k < i; k++) s -= m[i * n + k] * x[k];
    x[i] = s / m[i * n + i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i];
    for (let k = i + 1; k < n; k++) s -= m[k * n + i] * x[k];
    x[i] = s / m[i * n + i];
  }
  return true;
}
