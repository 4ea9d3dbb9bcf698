// Seeded random numbers for test data, the bench and the pendulum simulator (never the app's own
// SeededRandom: test data must not share the code's assumptions).

/** Seeded uniform generator in [0, 1) (mulberry32, public-domain algorithm by Tommy Ettinger). */
export function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * Standard normal deviate from a uniform rng (Box–Muller, cosine branch, u = 1 − rng() so that
 * log(u) is finite). The pendulum simulator keeps its own variant (u = max(rng(), 1e-300)): the two
 * draw different streams, and the seeded cases of each were set with its own.
 */
export function gaussian(rng: () => number): number {
  const u = 1 - rng();
  const v = rng();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}
