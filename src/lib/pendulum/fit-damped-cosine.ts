import { dampedCosineIterations } from './damped-cosine-iterations';

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
 * Steps: the iterations (damped-cosine-iterations, with damped-cosine-residuals and cholesky-solve),
 * then the result folded into A ≥ 0, φ in (−π, π], and R².
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
  const { sse, converged, iterations } = dampedCosineIterations(timeS, angleDeg, from, to, stride, p);

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
