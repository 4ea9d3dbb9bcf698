import { regularizedBeta } from './incomplete-beta';
import { logBeta } from './log-gamma';
import { normalQuantile } from './normal-distribution';
import { solvePositiveQuantile } from './quantile-solver';
import { StatsInputError } from './stats-input-error';

function checkDf(df1: number, df2: number, where: string): void {
  if (!(df1 > 0) || !Number.isFinite(df1) || !(df2 > 0) || !Number.isFinite(df2)) {
    throw new StatsInputError(`${where}: degrees of freedom (${df1}, ${df2}) must be positive and finite`);
  }
}

function tail(f: number, df1: number, df2: number, upper: boolean): number {
  const denominator = df1 * f + df2;
  // x = d1·f/(d1·f + d2) and 1 − x = d2/(d1·f + d2), both without cancellation.
  return regularizedBeta((df1 * f) / denominator, df2 / denominator, df1 / 2, df2 / 2, upper);
}

function logDensity(f: number, df1: number, df2: number): number {
  return (
    (df1 / 2) * Math.log(df1 / df2) +
    (df1 / 2 - 1) * Math.log(f) -
    ((df1 + df2) / 2) * Math.log1p((df1 * f) / df2) -
    logBeta(df1 / 2, df2 / 2)
  );
}

/**
 * F (Fisher–Snedecor) CDF with df1, df2 > 0 (non-integer allowed, as the Satterthwaite df of the
 * ICC(2,·) interval needs), lower tail or `upper`.
 * Method: I_x(d1/2, d2/2) with x = d1·f/(d1·f + d2) (Abramowitz & Stegun 26.6.2).
 * Throws StatsInputError for bad df; NaN for NaN f; 0 (or 1 upper) for f ≤ 0.
 */
export function fCdf(f: number, df1: number, df2: number, upper = false): number {
  checkDf(df1, df2, 'fCdf');
  if (Number.isNaN(f)) return Number.NaN;
  if (f <= 0) return upper ? 1 : 0;
  if (f === Number.POSITIVE_INFINITY) return upper ? 0 : 1;
  return tail(f, df1, df2, upper);
}


/**
 * F quantile: the f with P(F ≤ f) = p.
 * Method: start from the normal approximation to the cube roots of the two chi-squares
 * (Paulson 1942, via Wilson–Hilferty), refined by safeguarded Newton on the log of the smaller
 * tail (solvePositiveQuantile). Throws StatsInputError for p outside [0, 1] or bad df.
 */
export function fQuantile(p: number, df1: number, df2: number): number {
  checkDf(df1, df2, 'fQuantile');
  if (Number.isNaN(p)) return Number.NaN;
  if (p < 0 || p > 1) throw new StatsInputError(`fQuantile: probability ${p} is outside [0, 1]`);
  if (p === 0) return 0;
  if (p === 1) return Number.POSITIVE_INFINITY;
  const upper = p > 0.5;
  const target = upper ? 1 - p : p;
  // Paulson: solve ((1 − b)·w − (1 − a)) / √(b·w² + a) = z for w = f^(1/3), a = 2/(9d1), b = 2/(9d2).
  const z = normalQuantile(p);
  const a = 2 / (9 * df1);
  const b = 2 / (9 * df2);
  const A = (1 - b) * (1 - b) - z * z * b;
  const B = -2 * (1 - a) * (1 - b);
  const C = (1 - a) * (1 - a) - z * z * a;
  const disc = B * B - 4 * A * C;
  let start = 1;
  if (A > 0 && disc >= 0) {
    const w = (-B + (z >= 0 ? 1 : -1) * Math.sqrt(disc)) / (2 * A);
    if (w > 0) start = w * w * w;
  }
  return solvePositiveQuantile(
    (x) => tail(x, df1, df2, upper),
    (x) => logDensity(x, df1, df2),
    target,
    upper,
    start,
  );
}
