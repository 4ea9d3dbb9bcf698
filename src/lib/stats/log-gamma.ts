// Lanczos approximation, g = 7, n = 9 (the widely used coefficient set of P. Godfrey); relative
// error of Γ about 1e-15 for positive arguments (coefficients written as their nearest doubles), so ln Γ has an absolute error near 1e-15·|ln Γ|.
const lanczosG = 7;
const lanczosCoefficients = [
  0.9999999999998099, 676.5203681218851, -1259.1392167224028, 771.3234287776531, -176.6150291621406,
  12.507343278686905, -0.13857109526572012, 9.984369578019572e-6, 1.5056327351493116e-7,
] as const;
const halfLogTwoPi = 0.9189385332046728; // ½·ln(2π)

/**
 * Natural logarithm of the gamma function for z > 0.
 * Method: Lanczos (1964) series with g = 7, 9 terms; reflection Γ(z)Γ(1−z) = π/sin(πz) below 0.5.
 * Returns NaN for z ≤ 0 or NaN (only positive arguments occur in the distributions here).
 */
export function logGamma(z: number): number {
  if (!(z > 0)) return Number.NaN;
  if (z < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * z)) - logGamma(1 - z);
  const x = z - 1;
  let series = lanczosCoefficients[0];
  for (let i = 1; i < 9; i++) series += (lanczosCoefficients[i] as number) / (x + i);
  const t = x + lanczosG + 0.5;
  return halfLogTwoPi + (x + 0.5) * Math.log(t) - t + Math.log(series);
}

/** ln B(a, b) = ln Γ(a) + ln Γ(b) − ln Γ(a + b), for a, b > 0. */
export function logBeta(a: number, b: number): number {
  return logGamma(a) + logGamma(b) - logGamma(a + b);
}
