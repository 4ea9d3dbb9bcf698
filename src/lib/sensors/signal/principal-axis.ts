/** Dominant eigenvector of a symmetric 3×3 matrix, with its share of the trace. */
export interface PrincipalAxis {
  /** Unit vector (x, y, z); its sign follows the start vector. */
  readonly axis: Float64Array;
  /** Largest eigenvalue. */
  readonly eigenvalue: number;
  /** Largest eigenvalue / trace: 1 when every vector lies on one line; NaN for a zero matrix. */
  readonly share: number;
  readonly iterations: number;
}

/**
 * Power iteration on a symmetric positive semi-definite 3×3 matrix (row-major, 9 entries): repeat
 * v ← M·v / |M·v| until v changes by less than 1e-12 (at most 500 steps). Converges geometrically with
 * ratio λ2/λ1; for the gyro second-moment matrix of a hinge motion λ2/λ1 is tiny, so a few steps do.
 * Golub & Van Loan, Matrix Computations, §7.3.1 (from memory). The result's sign is chosen to agree
 * with `start` (which must not be orthogonal to the answer: pass a large sample vector).
 * Throws RangeError when the matrix is not 9 finite numbers or `start` is zero.
 */
export function principalAxis(matrix: Float64Array, start: Float64Array): PrincipalAxis {
  if (matrix.length !== 9 || !matrix.every(Number.isFinite)) throw new RangeError('principalAxis: needs a 3×3 matrix of finite numbers');
  let x = start[0];
  let y = start[1];
  let z = start[2];
  let norm = Math.hypot(x, y, z);
  if (!(norm > 0)) throw new RangeError('principalAxis: the start vector is zero');
  x /= norm;
  y /= norm;
  z /= norm;
  const trace = matrix[0] + matrix[4] + matrix[8];
  let iterations = 0;
  for (; iterations < 500; iterations++) {
    const nx = matrix[0] * x + matrix[1] * y + matrix[2] * z;
    const ny = matrix[3] * x + matrix[4] * y + matrix[5] * z;
    const nz = matrix[6] * x + matrix[7] * y + matrix[8] * z;
    norm = Math.hypot(nx, ny, nz);
    if (!(norm > 0)) break;
    const change = Math.abs(nx / norm - x) + Math.abs(ny / norm - y) + Math.abs(nz / norm - z);
    x = nx / norm;
    y = ny / norm;
    z = nz / norm;
    if (change < 1e-12) break;
  }
  if (x * start[0] + y * start[1] + z * start[2] < 0) {
    x = -x;
    y = -y;
    z = -z;
  }
  const mx = matrix[0] * x + matrix[1] * y + matrix[2] * z;
  const my = matrix[3] * x + matrix[4] * y + matrix[5] * z;
  const mz = matrix[6] * x + matrix[7] * y + matrix[8] * z;
  const eigenvalue = x * mx + y * my + z * mz;
  return { axis: Float64Array.of(x, y, z), eigenvalue, share: trace > 0 ? eigenvalue / trace : Number.NaN, iterations };
}
