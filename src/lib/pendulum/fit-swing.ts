import { roundTo } from '../stats';
import { fitDampedCosine } from './fit-damped-cosine';
import type { PendulumFitIndices } from './pendulum-result';

const FIT_RATE_HZ = 100;

/** Where the swing is, in grid terms, for the fit's window and starting values. */
export interface SwingForFit {
  readonly gridS: Float64Array;
  readonly angleDeg: Float64Array;
  readonly fs: number;
  readonly releaseIndex: number;
  readonly restOnsetIndex: number;
  readonly restAngleDeg: number;
  readonly a0Deg: number;
  readonly firstPeakAt: number;
  readonly firstPeakDeg: number;
}

/**
 * Step 6 of analysePendulumTrace: fits the damped cosine (fitDampedCosine) from release to one second
 * into the plateau, at about FIT_RATE_HZ, started from the first half-swing (amplitude A0, τ from the
 * first peak's decay, ω from its time). A fit that does not converge reports nulls and a warning;
 * one that explains under 80 % of the swing reports its values and a warning.
 */
export function fitSwing(s: SwingForFit, warnings: string[]): PendulumFitIndices {
  const m = s.angleDeg.length;
  const i0 = Math.min(Math.ceil(s.releaseIndex), m - 1);
  const fitEnd = Math.min(m, s.restOnsetIndex + Math.round(s.fs));
  const firstPeakS = (s.firstPeakAt - s.releaseIndex) / s.fs;
  const decayRatio = (s.firstPeakDeg - s.restAngleDeg) / Math.max(s.a0Deg, 1e-9);
  const fit = fitDampedCosine(s.gridS, s.angleDeg, i0, fitEnd, Math.max(1, Math.round(s.fs / FIT_RATE_HZ)), {
    restDeg: s.restAngleDeg,
    amplitudeDeg: Math.max(s.a0Deg, 1),
    tauS: decayRatio > 0.01 && decayRatio < 1 ? -firstPeakS / Math.log(decayRatio) : firstPeakS,
    omegaRadS: Math.PI / Math.max(firstPeakS, 2 / s.fs),
    phaseRad: Math.PI,
  });
  if (!fit.converged) {
    warnings.push('the damped-cosine fit did not converge; no fit values are reported');
    return { amplitudeDeg: null, tauS: null, omegaRadS: null, r2: null, converged: false, phaseRad: null, restDeg: null };
  }
  if (fit.r2 < 0.8) warnings.push(`the damped-cosine fit explains ${roundTo(100 * fit.r2, 0)} % of the swing; it is not a simple damped oscillation`);
  return { amplitudeDeg: fit.amplitudeDeg, tauS: fit.tauS, omegaRadS: fit.omegaRadS, r2: fit.r2, converged: true, phaseRad: fit.phaseRad, restDeg: fit.restDeg };
}
