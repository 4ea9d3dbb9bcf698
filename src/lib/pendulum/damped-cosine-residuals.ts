import { dampedCosineDeg } from './damped-cosine';

// The damped cosine's sum of squares and normal equations, for fitDampedCosine's Levenberg–Marquardt
// step. Parameters p = [θrest, A, λ, ω, φ]; samples i in [from, to) by `stride`, times from t0.

/** Number of parameters of the damped cosine: θrest, A, λ = 1/τ, ω, φ. */
export const PARAMETERS = 5;

/** Σ (y − model)² over the fitted samples. */
export function sumOfSquares(t: Float64Array, y: Float64Array, from: number, to: number, stride: number, t0: number, p: Float64Array): number {
  const [rest, a, lambda, omega, phase] = p;
  let sum = 0;
  for (let i = from; i < to; i += stride) {
    const tt = t[i] - t0;
    const r = y[i] - dampedCosineDeg(rest, a, lambda, omega, phase, tt);
    sum += r * r;
  }
  return sum;
}

/** Accumulates JᵀJ and Jᵀr (r = data − model) for the current parameters. */
export function normalEquations(
  t: Float64Array,
  y: Float64Array,
  from: number,
  to: number,
  stride: number,
  t0: number,
  p: Float64Array,
  jtj: Float64Array,
  jtr: Float64Array,
  row: Float64Array,
): void {
  jtj.fill(0);
  jtr.fill(0);
  const [rest, a, lambda, omega, phase] = p;
  for (let i = from; i < to; i += stride) {
    const tt = t[i] - t0;
    const e = Math.exp(-lambda * tt);
    const c = Math.cos(omega * tt + phase);
    const s = Math.sin(omega * tt + phase);
    const r = y[i] - dampedCosineDeg(rest, a, lambda, omega, phase, tt);
    row[0] = 1;
    row[1] = e * c;
    row[2] = -tt * a * e * c;
    row[3] = -tt * a * e * s;
    row[4] = -a * e * s;
    for (let j = 0; j < PARAMETERS; j++) {
      jtr[j] += row[j] * r;
      for (let k = 0; k <= j; k++) jtj[j * PARAMETERS + k] += row[j] * row[k];
    }
  }
  for (let j = 0; j < PARAMETERS; j++) for (let k = 0; k < j; k++) jtj[k * PARAMETERS + j] = jtj[j * PARAMETERS + k];
}
