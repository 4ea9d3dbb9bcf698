import { studentTQuantile } from './student-t-distribution';

// Two-sided 95 % t critical values by integer df, filled on first use: trend fits on many series
// share a handful of df, and a quantile costs a few microseconds.
const cacheSize = 1024;
const cache = new Float64Array(cacheSize);

/**
 * The 97.5th percentile of Student t with integer `df` ≥ 1 (the multiplier of a two-sided 95 %
 * interval), cached for df below 1024. NaN for df < 1.
 */
export function tCritical95(df: number): number {
  if (!(df >= 1)) return Number.NaN;
  if (df < cacheSize && Number.isInteger(df)) {
    const cached = cache[df] as number;
    if (cached !== 0) return cached;
    const value = studentTQuantile(0.975, df);
    cache[df] = value;
    return value;
  }
  return studentTQuantile(0.975, df);
}
