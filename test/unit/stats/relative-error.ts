// Shared comparison helper for the stats tests: relative error with an absolute floor near zero.
export function relativeError(actual: number, expected: number, floor = 1e-300): number {
  if (actual === expected) return 0;
  if (Number.isNaN(actual) || Number.isNaN(expected)) return Number.POSITIVE_INFINITY;
  return Math.abs(actual - expected) / Math.max(Math.abs(expected), floor);
}

/** Deterministic PRNG for seeded test data (mulberry32). */
export function seededRng(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviate from a uniform rng (Box–Muller). */
export function gaussian(rng: () => number): number {
  const u = 1 - rng();
  const v = rng();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}
