import { dampedCosineDeg } from './damped-cosine';

/** Result of fitting θ(t) = θrest + A·e^(−t/τ)·cos(ωt + φ). */
export interface DampedCosineFit {
  /** True when Levenberg–Marquardt met its stopping test with a decaying, oscillating solution. */
  readonly converged: boolean;
  readonly restDeg: number;
  /** A ≥ 0 (degrees); the sign is carried by φ. */
  readonly amplitudeDeg: number;
  /** Decay time constant τ (s). */
  readonly tauS: number;
  /** Angular frequency ω (rad/s). */
  readonly omegaRadS: number;
  /** Phase φ in (−π, π]. */
  readonly phaseRad: number;
  /** Coefficient of determination 1 − SSE/SST over the fitted samples (NaN when SST = 0). */
  readonly r2: number;
  readonly iterations: number;
}

/** Starting values for the fit. */
export interface DampedCosineStart {
  readonly restDeg: number;
  readonly amplitudeDeg: number;
  readonly tauS: number;
  readonly omegaRadS: number;
  readonly phaseRad: number;
}

const PARAMETERS = 5;
const MAX_ITERATIONS = 60;

/**
 * Least-squares fit of a damped cosine θ(t) = θrest + A·e^(−λt)·cos(ωt + φ), λ = 1/τ, to samples
 * (timeS[i], angleDeg[i]) for i in [from, to) taking every `stride`-th sample.
 *
 * Method: Levenberg–Marquardt with Marquardt's diagonal scaling (JᵀJ + μ·diag(JᵀJ)) and the
 * multiplicative damping update (μ ÷ 3 on an accepted step, × 2 otherwise), as in Madsen, Nielsen &
 * Tingleff, "Methods for non-linear least squares problems" (2004), section 3.2 (from memory).
 * The 5×5 normal equations are solved by Cholesky factorisation. Stops when an accepted step lowers
 * the sum of squares by less than 1e-10 relatively or moves every parameter by less than 1e-9
 * relatively (or the next step would move none by more than that); 60 iterations without that, a non-finite value, λ ≤ 0 (no decay) or ω ≤ 0 report
 * `converged: false` (the numbers are then the last iterate, to be shown as "not converged", not used).
 *
 * Cost: O(iterations × samples) exponentials and cosines; pass a stride that brings the fitted rate
 * to about 100 Hz. Allocates only fixed 5- and 25-element work arrays.
 */
export function fitDampedCosine(
  timeS: Float64Array,
  angleDeg: Float64Array,
  from: number,
  to: number,
  stride: number,
  start: DampedCosineStart,
): DampedCosineFit {
  const p = new Float64Array([start.restDeg, start.amplitudeDeg, 1 / start.tauS, start.omegaRadS, start.phaseRad]);
  const trial = new Float64Array(PARAMETERS);
  const jtj = new Float64Array(PARAMETERS * PARAMETERS);
  const jtr = new Float64Array(PARAMETERS);
  const system = new Float64Array(PARAMETERS * PARAMETERS);
  const step = new Float64Array(PARAMETERS);
  const gradient = new Float64Array(PARAMETERS);
  const t0 = timeS[from];

  let sse = sumOfSquares(timeS, angleDeg, from, to, stride, t0, p);
  let mu = 1e-3;
  let converged = false;
  let iterations = 0;
  for (; iterations < MAX_ITERATIONS && Number.isFinite(sse); iterations++) {
    normalEquations(timeS, angleDeg, from, to, stride, t0, p, jtj, jtr, gradient);
    let accepted = false;
    for (let attempt = 0; attempt < 30 && !accepted && !converged; attempt++) {
      for (let k = 0; k < PARAMETERS * PARAMETERS; k++) system[k] = jtj[k];
      for (let k = 0; k < PARAMETERS; k++) system[k * PARAMETERS + k] += mu * Math.max(jtj[k * PARAMETERS + k], 1e-12);
      if (!choleskySolve(system, jtr, step)) {
        mu *= 2;
        continue;
      }
      // A step below the parameters' precision: the minimum is reached (no need to try it).
      let negligible = true;
      for (let k = 0; k < PARAMETERS; k++) if (Math.abs(step[k]) > 1e-9 * (Math.abs(p[k]) + 1e-9)) negligible = false;
      if (negligible) {
        converged = true;
        break;
      }
      for (let k = 0; k < PARAMETERS; k++) trial[k] = p[k] + step[k];
      const trialSse = sumOfSquares(timeS, angleDeg, from, to, stride, t0, trial);
      if (Number.isFinite(trialSse) && trialSse <= sse) {
        let small = true;
        for (let k = 0; k < PARAMETERS; k++) if (Math.abs(step[k]) > 1e-9 * (Math.abs(p[k]) + 1e-9)) small = false;
        const relativeGain = (sse - trialSse) / Math.max(sse, 1e-300);
        p.set(trial);
        sse = trialSse;
        mu = Math.max(mu / 3, 1e-12);
        accepted = true;
        if (relativeGain < 1e-10 || small) converged = true;
      } else {
        mu *= 2;
      }
    }
    if (!accepted && !converged) {
      // No downhill step even at heavy damping: a (local) minimum within numerical precision.
      converged = true;
    }
    if (converged) break;
  }

  // Fold the sign of A into φ and wrap φ into (−π, π].
  let amplitude = p[1];
  let phase = p[4];
  if (amplitude < 0) {
    amplitude = -amplitude;
    phase += Math.PI;
  }
  phase = phase - 2 * Math.PI * Math.ceil((phase - Math.PI) / (2 * Math.PI));
  const lambda = p[2];
  const omega = p[3];
  const finite = p.every((v) => Number.isFinite(v)) && Number.isFinite(sse);
  const ok = converged && finite && lambda > 0 && omega > 0;
  let mean = 0;
  let count = 0;
  for (let i = from; i < to; i += stride) {
    mean += angleDeg[i];
    count++;
  }
  mean /= count;
  let sst = 0;
  for (let i = from; i < to; i += stride) sst += (angleDeg[i] - mean) ** 2;
  return {
    converged: ok,
    restDeg: p[0],
    amplitudeDeg: amplitude,
    tauS: 1 / lambda,
    omegaRadS: omega,
    phaseRad: phase,
    r2: sst > 0 ? 1 - sse / sst : Number.NaN,
    iterations: iterations + 1,
  };
}

function sumOfSquares(t: Float64Array, y: Float64Array, from: number, to: number, stride: number, t0: number, p: Float64Array): number {
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
function normalEquations(
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

/** Solves the symmetric positive-definite system in place by Cholesky; false when not positive definite. */
function choleskySolve(m: Float64Array, b: Float64Array, x: Float64Array): boolean {
  const n = PARAMETERS;
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
