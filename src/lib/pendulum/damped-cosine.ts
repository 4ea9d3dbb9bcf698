/**
 * The pendulum's damped-cosine model θ(t) = θrest + A·e^(−λt)·cos(ωt + φ), λ = 1/τ, at t seconds from
 * release: the one place the model is written (the fit's residuals and Jacobian, the chart's fitted
 * curve). Positional arguments so that inner loops allocate nothing.
 *
 * @example
 * dampedCosineDeg(70, 70, 0.5, 2 * Math.PI, Math.PI, 0); // 0: the leg held straight at release
 */
export function dampedCosineDeg(restDeg: number, amplitudeDeg: number, decayPerS: number, omegaRadS: number, phaseRad: number, tS: number): number {
  return restDeg + amplitudeDeg * Math.exp(-decayPerS * tS) * Math.cos(omegaRadS * tS + phaseRad);
}

/** A fitted curve's parameters as the analysis reports them (τ in seconds). */
export interface DampedCosineParameters {
  readonly restDeg: number;
  readonly amplitudeDeg: number;
  readonly tauS: number;
  readonly omegaRadS: number;
  readonly phaseRad: number;
}

/** `dampedCosineDeg` for a reported fit (τ rather than λ). */
export function dampedCosineFitDeg(fit: DampedCosineParameters, tS: number): number {
  return dampedCosineDeg(fit.restDeg, fit.amplitudeDeg, 1 / fit.tauS, fit.omegaRadS, fit.phaseRad, tS);
}

