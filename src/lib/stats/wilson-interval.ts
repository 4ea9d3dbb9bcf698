import { StatsInputError } from './stats-input-error';

const z975 = 1.959963984540054;

/**
 * Wilson score interval for a binomial proportion r/n without continuity correction (Wilson 1927;
 * Newcombe 1998, method 3): [2np + z² ∓ z·√(z² + 4npq)] / [2(n + z²)], z = Φ⁻¹(0.975) by default.
 * Returns [0, 1]-bounded limits; NaN limits for n = 0.
 * Throws StatsInputError unless 0 ≤ r ≤ n are integers and z > 0.
 */
export function wilsonInterval(successes: number, trials: number, z = z975): readonly [number, number] {
  if (!Number.isInteger(successes) || !Number.isInteger(trials) || successes < 0 || successes > trials) {
    throw new StatsInputError(`wilsonInterval: ${successes} successes of ${trials} trials is not a count`);
  }
  if (!(z > 0)) throw new StatsInputError(`wilsonInterval: z ${z} must be positive`);
  if (trials === 0) return [Number.NaN, Number.NaN];
  const p = successes / trials;
  const q = 1 - p;
  const z2 = z * z;
  const centre = 2 * trials * p + z2;
  const spread = z * Math.sqrt(z2 + 4 * trials * p * q);
  const denominator = 2 * (trials + z2);
  // At r = 0 (or r = n) the exact limit is 0 (or 1); the formula gives it up to rounding.
  const lower = successes === 0 ? 0 : (centre - spread) / denominator;
  const upper = successes === trials ? 1 : (centre + spread) / denominator;
  return [lower, upper];
}
