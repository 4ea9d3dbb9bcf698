import { logGamma } from './log-gamma';

const epsilon = 1e-16;
const tiny = 1e-300;
const maxIterations = 100_000;

/**
 * Regularised incomplete gamma functions P(a, x) (lower) and Q(a, x) = 1 − P(a, x) (upper), a > 0,
 * x ≥ 0. Method: power series for x < a + 1, otherwise the Legendre continued fraction evaluated
 * with the modified Lentz algorithm (Press et al., Numerical Recipes, 3rd ed., §6.2); the side not
 * computed directly is 1 minus the other, so the side asked for in a tail keeps its relative
 * accuracy (about 1e-14 for a up to 1e3, degrading as the prefactor's ln Γ(a) grows).
 * Cost: O(√a + |x − a|/√a) terms near the mode, a few dozen elsewhere. NaN for NaN input.
 */
export function regularizedGamma(a: number, x: number, upper: boolean): number {
  if (Number.isNaN(a) || Number.isNaN(x) || !(a > 0) || x < 0) return Number.NaN;
  if (x === 0) return upper ? 1 : 0;
  if (x === Number.POSITIVE_INFINITY) return upper ? 0 : 1;
  const logFront = -x + a * Math.log(x) - logGamma(a);
  if (x < a + 1) {
    let term = 1 / a;
    let sum = term;
    let denominator = a;
    for (let i = 0; i < maxIterations; i++) {
      denominator += 1;
      term *= x / denominator;
      sum += term;
      if (Math.abs(term) < Math.abs(sum) * epsilon) break;
    }
    const lower = sum * Math.exp(logFront);
    return upper ? 1 - lower : lower;
  }
  let b = x + 1 - a;
  let c = 1 / tiny;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < maxIterations; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < epsilon) break;
  }
  const upperValue = Math.exp(logFront) * h;
  return upper ? upperValue : 1 - upperValue;
}
