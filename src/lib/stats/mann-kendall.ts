import { normalCdf } from './normal-distribution';
import { insertionSortRange } from './insertion-sort-range';
import { StatsInputError } from './stats-input-error';

/** Mann–Kendall trend test of one series. */
export interface MannKendall {
  readonly n: number;
  /** Kendall's S = Σ_{i<j} sign(y_j − y_i) over time-ordered points. */
  readonly s: number;
  /** Var(S) with the tie correction. */
  readonly variance: number;
  /** Kendall's τ-b between time and value (times are untied). */
  readonly tau: number;
  /** Two-sided p. */
  readonly p: number;
  /** 'exact' (no ties, n ≤ 30) or 'normal-cc' (normal approximation with continuity correction). */
  readonly method: 'exact' | 'normal-cc';
}

/** Slots of the `out` array filled by mannKendallInto; method slot: 1 exact, 0 normal-cc. */
const mannKendallSlots = { n: 0, s: 1, variance: 2, tau: 3, p: 4, exact: 5 } as const;

const exactMaxN = 30;
// cumulative[n][d] = P(D ≤ d) for the number of discordant pairs D among n untied points under H0.
const cumulative: Float64Array[] = [];

function discordantCdf(n: number): Float64Array {
  let table = cumulative[n];
  if (table) return table;
  // Probabilities of the inversion count (Mahonian numbers / n!): adding the m-th point adds an
  // independent uniform number of inversions in 0..m−1.
  let density = new Float64Array([1]);
  for (let m = 2; m <= n; m++) {
    const next = new Float64Array(density.length + m - 1);
    for (let k = 0; k < next.length; k++) {
      let sum = 0;
      for (let j = 0; j < m; j++) {
        const index = k - j;
        if (index >= 0 && index < density.length) sum += density[index] as number;
      }
      next[k] = sum / m;
    }
    density = next;
  }
  table = new Float64Array(density.length);
  let running = 0;
  for (let k = 0; k < density.length; k++) {
    running += density[k] as number;
    table[k] = running;
  }
  cumulative[n] = table;
  return table;
}

/**
 * Scratch length mannKendallInto needs for `length` points.
 */
export function mannKendallScratchLength(length: number): number {
  return length;
}

/**
 * Mann–Kendall test for a monotonic trend (Mann 1945; Kendall 1975): S = Σ_{i<j} sign(y_j − y_i)
 * over points in time order, Var(S) = [n(n−1)(2n+5) − Σ t(t−1)(2t+5)]/18 with t the sizes of groups
 * of tied values. Two-sided p: exact from the null distribution of Kendall's statistic (inversion
 * counts of a random permutation) when there are no ties and n ≤ 30; otherwise the normal
 * approximation with continuity correction, z = (S − sign S)/√Var(S), p = 2·(1 − Φ(|z|)).
 * Writes into `out` (length ≥ 6, mannKendallSlots); `scratch` (length ≥ n) avoids allocation.
 * Points with NaN are skipped. NaN p and τ when fewer than 2 points or all values tie.
 * Cost O(n²); the exact table for each n is built once (O(n³), n ≤ 30) and cached.
 * Throws StatsInputError when lengths differ, the scratch is short, or times are not strictly
 * increasing (two assessments at the same time have no order).
 */
export function mannKendallInto(
  timesDay: Float64Array,
  values: Float64Array,
  out: Float64Array,
  scratch: Float64Array = new Float64Array(timesDay.length),
): Float64Array {
  const length = timesDay.length;
  if (values.length !== length) throw new StatsInputError(`mannKendall: ${length} times but ${values.length} values`);
  if (scratch.length < length) throw new StatsInputError(`mannKendall: scratch of ${scratch.length} is shorter than ${length}`);
  // Compact the usable values into the scratch (time order kept), checking the time order.
  let n = 0;
  let previousTime = Number.NEGATIVE_INFINITY;
  for (let i = 0; i < length; i++) {
    const ti = timesDay[i] as number;
    const yi = values[i] as number;
    if (Number.isNaN(ti) || Number.isNaN(yi)) continue;
    if (!(ti > previousTime)) throw new StatsInputError(`mannKendall: times are not strictly increasing at index ${i}`);
    previousTime = ti;
    scratch[n++] = yi;
  }
  let s = 0;
  let tiePairs = 0;
  for (let i = 0; i < n; i++) {
    const yi = scratch[i] as number;
    for (let j = i + 1; j < n; j++) {
      const yj = scratch[j] as number;
      // Boolean arithmetic instead of nested ternaries: no unpredictable branches.
      s += +(yj > yi) - +(yj < yi);
      tiePairs += +(yj === yi);
    }
  }
  // Tie groups matter only when some values tie; continuous series skip the sort.
  let tieSum = 0;
  if (tiePairs > 0) {
    insertionSortRange(scratch, 0, n);
    let run = 1;
    for (let i = 1; i <= n; i++) {
      if (i < n && scratch[i] === scratch[i - 1]) {
        run++;
      } else {
        if (run > 1) tieSum += run * (run - 1) * (2 * run + 5);
        run = 1;
      }
    }
  }
  const pairs = (n * (n - 1)) / 2;
  const variance = (n * (n - 1) * (2 * n + 5) - tieSum) / 18;
  const tau = s / Math.sqrt(pairs * (pairs - tiePairs));
  let p: number;
  let exact = 0;
  if (n < 2 || variance <= 0) {
    p = Number.NaN;
  } else if (tiePairs === 0 && n <= exactMaxN) {
    exact = 1;
    // S = pairs − 2D; P(S ≥ |s|) = P(D ≤ (pairs − |s|)/2), doubled for two sides.
    const table = discordantCdf(n);
    p = Math.min(1, 2 * (table[(pairs - Math.abs(s)) / 2] as number));
  } else {
    const z = (s - Math.sign(s)) / Math.sqrt(variance);
    p = Math.min(1, 2 * normalCdf(Math.abs(z), true));
  }
  out[mannKendallSlots.n] = n;
  out[mannKendallSlots.s] = s;
  out[mannKendallSlots.variance] = variance;
  out[mannKendallSlots.tau] = n < 2 ? Number.NaN : tau;
  out[mannKendallSlots.p] = p;
  out[mannKendallSlots.exact] = exact;
  return out;
}

/** Mann–Kendall trend test; the object form of mannKendallInto (same method and errors). */
export function mannKendall(timesDay: Float64Array, values: Float64Array, scratch?: Float64Array): MannKendall {
  const out = mannKendallInto(timesDay, values, new Float64Array(6), scratch);
  return {
    n: out[mannKendallSlots.n] as number,
    s: out[mannKendallSlots.s] as number,
    variance: out[mannKendallSlots.variance] as number,
    tau: out[mannKendallSlots.tau] as number,
    p: out[mannKendallSlots.p] as number,
    method: out[mannKendallSlots.exact] === 1 ? 'exact' : 'normal-cc',
  };
}
