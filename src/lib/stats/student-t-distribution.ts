import { regularizedBeta } from './incomplete-beta';
import { logBeta } from './log-gamma';
import { normalQuantile } from './normal-distribution';
import { solvePositiveQuantile } from './quantile-solver';
import { StatsInputError } from './stats-input-error';

function checkDf(df: number, where: string): void {
  if (!(df > 0) || !Number.isFinite(df)) throw new StatsInputError(`${where}: degrees of freedom ${df} must be positive and finite`);
}

// Upper tail P(T > t) for t ≥ 0: ½·I_{ν/(ν+t²)}(ν/2, ½), with both arguments formed without cancellation.
function upperTailNonNegative(t: number, df: number): number {
  const t2 = t * t;
  return 0.5 * regularizedBeta(df / (df + t2), t2 / (df + t2), df / 2, 0.5, false);
}

function logDensity(t: number, df: number): number {
  return -0.5 * Math.log(df) - logBeta(df / 2, 0.5) - ((df + 1) / 2) * Math.log1p((t * t) / df);
}

/**
 * Student t CDF with `df` > 0 degrees of freedom (non-integer allowed), lower tail or `upper`.
 * Method: P(T > |t|) = ½·I_{ν/(ν+t²)}(ν/2, ½) (Abramowitz & Stegun 26.7.1 via 26.5.27) with the
 * regularised incomplete beta function; both tails keep their relative accuracy (≈1e-13).
 * Throws StatsInputError for df ≤ 0 or infinite; NaN for NaN t.
 */
export function studentTCdf(t: number, df: number, upper = false): number {
  checkDf(df, 'studentTCdf');
  if (Number.isNaN(t)) return Number.NaN;
  const tail = upperTailNonNegative(Math.abs(t), df);
  const wantSmallSide = upper ? t >= 0 : t <= 0;
  return wantSmallSide ? tail : 1 - tail;
}


/**
 * Student t quantile: the t with P(T ≤ t) = p, df > 0 (non-integer allowed).
 * Method: start from the Cornish–Fisher expansion about the normal quantile (Abramowitz & Stegun
 * 26.7.5) or, for df < 3, the power-law tail; refine by safeguarded Newton on the log tail
 * (see solvePositiveQuantile) for the positive half, using symmetry for p < ½.
 * Throws StatsInputError for p outside [0, 1] or bad df; NaN for NaN p.
 */
export function studentTQuantile(p: number, df: number): number {
  checkDf(df, 'studentTQuantile');
  if (Number.isNaN(p)) return Number.NaN;
  if (p < 0 || p > 1) throw new StatsInputError(`studentTQuantile: probability ${p} is outside [0, 1]`);
  if (p === 0.5) return 0;
  if (p === 0) return Number.NEGATIVE_INFINITY;
  if (p === 1) return Number.POSITIVE_INFINITY;
  // Work on the positive half with the upper tail q ≤ ½ (1 − p is exact for p > ½).
  const q = p > 0.5 ? 1 - p : p;
  const sign = p > 0.5 ? 1 : -1;
  let start: number;
  if (df >= 3) {
    const z = -normalQuantile(q);
    const z2 = z * z;
    const g1 = (z * (z2 + 1)) / 4;
    const g2 = (z * ((5 * z2 + 16) * z2 + 3)) / 96;
    const g3 = (z * (((3 * z2 + 19) * z2 + 17) * z2 - 15)) / 384;
    start = z + g1 / df + g2 / (df * df) + g3 / (df * df * df);
  } else {
    // P(T > t) ≈ K·t^(−ν)/ν for large t, K = ν^((ν+1)/2)/(√ν·B(ν/2, ½)).
    const logK = ((df + 1) / 2) * Math.log(df) - 0.5 * Math.log(df) - logBeta(df / 2, 0.5);
    start = Math.exp((logK - Math.log(df * q)) / df);
  }
  const t = solvePositiveQuantile(
    (x) => upperTailNonNegative(x, df),
    (x) => logDensity(x, df),
    q,
    true,
    start,
  );
  return sign * t;
}
