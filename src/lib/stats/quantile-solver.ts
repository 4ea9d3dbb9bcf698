/**
 * Solves tail(x) = target for x > 0 by Newton's method on ln tail(x) − ln target, with a
 * bisection safeguard (geometric once the root is bracketed away from 0). `upper` says the tail
 * decreases with x (survival function) rather than increases (CDF). `logDensity` is ln f(x), the
 * derivative of the CDF. Working in logarithms keeps tiny tail targets (1e-12 and below) as easy as
 * central ones; the solver stops when a step moves x by less than 4e-16·x, so the result is as
 * accurate as the tail function allows (relative error ≈ condition number × tail error).
 * Internal: callers check their arguments.
 */
export function solvePositiveQuantile(
  tail: (x: number) => number,
  logDensity: (x: number) => number,
  target: number,
  upper: boolean,
  start: number,
): number {
  const logTarget = Math.log(target);
  let lo = 0;
  let hi = Number.POSITIVE_INFINITY;
  let x = start > 0 && Number.isFinite(start) ? start : 1;
  for (let iteration = 0; iteration < 400; iteration++) {
    const value = tail(x);
    const residual = Math.log(value) - logTarget;
    if (residual === 0) return x;
    // Below the root when the CDF is too small or the survival function too large.
    const below = upper ? residual > 0 : residual < 0;
    if (below) lo = x;
    else hi = x;
    let next = Number.NaN;
    if (value > 0) {
      const slope = Math.exp(logDensity(x) - Math.log(value)) * (upper ? -1 : 1);
      next = x - residual / slope;
    }
    if (!(next > lo && next < hi)) {
      if (Number.isFinite(hi)) next = lo > 0 ? Math.sqrt(lo * hi) : hi / 8;
      else next = lo * 8;
      if (next === lo || next === hi) return x;
    }
    if (Math.abs(next - x) <= 4e-16 * next) return next;
    x = next;
  }
  return x;
}
