import { choleskySolve } from './cholesky-solve';
import { normalEquations, PARAMETERS, sumOfSquares } from './damped-cosine-residuals';

const MAX_ITERATIONS = 60;

/**
 * The iteration step of fitDampedCosine (its doc comment gives the method and the stopping tests):
 * Levenberg–Marquardt on p = [θrest, A, λ, ω, φ], updated in place. Returns the final sum of squares,
 * whether a stopping test was met, and the iteration index reached.
 */
export function dampedCosineIterations(
  timeS: Float64Array,
  angleDeg: Float64Array,
  from: number,
  to: number,
  stride: number,
  p: Float64Array,
): { sse: number; converged: boolean; iterations: number } {
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
      if (!choleskySolve(system, jtr, step, PARAMETERS)) {
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
  return { sse, converged, iterations };
}
