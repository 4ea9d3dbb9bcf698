// Shared comparison helper for tests, the bench and the simulators: relative error with an absolute
// floor near zero (simple-statistics' habit of relative-error tolerances).

/**
 * |actual − expected| / max(|expected|, floor); 0 when both are identical (including ±Infinity),
 * +Infinity when either is NaN, so a `toBeLessThan(tolerance)` fails on NaN.
 *
 * @example
 * relativeError(1.0001, 1); // ≈ 1e-4
 */
export function relativeError(actual: number, expected: number, floor = 1e-300): number {
  if (actual === expected) return 0;
  if (Number.isNaN(actual) || Number.isNaN(expected)) return Number.POSITIVE_INFINITY;
  return Math.abs(actual - expected) / Math.max(Math.abs(expected), floor);
}
