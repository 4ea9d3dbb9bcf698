import { regularizedGamma } from './incomplete-gamma';
import { logGamma } from './log-gamma';
import { normalQuantile } from './normal-distribution';
import { solvePositiveQuantile } from './quantile-solver';
import { StatsInputError } from './stats-input-error';

function checkDf(df: number, where: string): void {
  if (!(df > 0) || !Number.isFinite(df)) throw new StatsInputError(`${where}: degrees of freedom ${df} must be positive and finite`);
}

function logDensity(x: number, df: number): number {
  const a = df / 2;
  return (a - 1) * Math.log(x) - x / 2 - a * Math.LN2 - logGamma(a);
}

/**
 * Chi-square CDF with `df` > 0 degrees of freedom (non-integer allowed), lower tail or `upper`.
 * Method: P(ν/2, x/2) or Q(ν/2, x/2), the regularised incomplete gamma functions.
 * Throws StatsInputError for bad df; NaN for NaN x; 0 (or 1 upper) for x ≤ 0.
 */
export function chiSquareCdf(x: number, df: number, upper = false): number {
  checkDf(df, 'chiSquareCdf');
  if (Number.isNaN(x)) return Number.NaN;
  if (x <= 0) return upper ? 1 : 0;
  return regularizedGamma(df / 2, x / 2, upper);
}


/**
 * Chi-square quantile: the x with P(X ≤ x) = p.
 * Method: Wilson–Hilferty start (or the small-x series start x ≈ 2·(p·Γ(ν/2 + 1))^(2/ν) when that
 * fails), refined by safeguarded Newton on the log of the smaller tail (solvePositiveQuantile).
 * Throws StatsInputError for p outside [0, 1] or bad df; NaN for NaN p.
 */
export function chiSquareQuantile(p: number, df: number): number {
  checkDf(df, 'chiSquareQuantile');
  if (Number.isNaN(p)) return Number.NaN;
  if (p < 0 || p > 1) throw new StatsInputError(`chiSquareQuantile: probability ${p} is outside [0, 1]`);
  if (p === 0) return 0;
  if (p === 1) return Number.POSITIVE_INFINITY;
  const upper = p > 0.5;
  const target = upper ? 1 - p : p;
  const h = 2 / (9 * df);
  const cube = 1 - h + normalQuantile(p) * Math.sqrt(h);
  let start = df * cube * cube * cube;
  const a = df / 2;
  const smallStart = 2 * Math.exp((Math.log(p) + logGamma(a + 1)) / a);
  if (!(start > 0) || (!upper && smallStart < start)) start = smallStart;
  return solvePositiveQuantile(
    (x) => regularizedGamma(a, x / 2, upper),
    (x) => logDensity(x, df),
    target,
    upper,
    start,
  );
}
