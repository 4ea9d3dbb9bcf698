import { normalCdf } from './normal-distribution';
import { StatsInputError } from './stats-input-error';

/** Wilcoxon signed-rank test of paired differences against a zero median. */
export interface WilcoxonSignedRank {
  /** Differences used (zeros and NaN dropped). */
  readonly n: number;
  readonly zerosDropped: number;
  /** Sum of ranks of positive differences. */
  readonly wPlus: number;
  readonly wMinus: number;
  /** min(W+, W−), the two-sided statistic. */
  readonly statistic: number;
  /** Two-sided p. */
  readonly p: number;
  /** z of the normal approximation (NaN for the exact method). */
  readonly z: number;
  readonly method: 'exact' | 'normal-cc';
}

const exactMaxN = 50;
// cumulativeByN[n][w] = P(W+ ≤ w) for n untied, non-zero differences under H0.
const cumulativeByN: Float64Array[] = [];

function exactCdf(n: number): Float64Array {
  const cached = cumulativeByN[n];
  if (cached) return cached;
  const maxW = (n * (n + 1)) / 2;
  // Subset-sum counts of {1..n}: each rank is positive with probability ½; counts ≤ 2^50 stay exact.
  const counts = new Float64Array(maxW + 1);
  counts[0] = 1;
  for (let rank = 1; rank <= n; rank++) {
    for (let w = maxW; w >= rank; w--) counts[w] = (counts[w] as number) + (counts[w - rank] as number);
  }
  const total = 2 ** n;
  const table = new Float64Array(maxW + 1);
  let running = 0;
  for (let w = 0; w <= maxW; w++) {
    running += counts[w] as number;
    table[w] = running / total;
  }
  cumulativeByN[n] = table;
  return table;
}

/**
 * Wilcoxon (1945) signed-rank test, two-sided. Zero differences are dropped before ranking
 * (Wilcoxon's own convention; scipy.stats.wilcoxon's default zero_method='wilcox'); tied |d| get
 * mid-ranks. p is exact (the null distribution of W+ by counting rank subsets) when n ≤ 50 after
 * dropping zeros and no |d| tie; otherwise the normal approximation with tie and continuity
 * correction: z = (T − n(n+1)/4 − ½·sign(T − n(n+1)/4))/σ, T = min(W+, W−),
 * σ² = n(n+1)(2n+1)/24 − Σ(t³ − t)/48 — the same as scipy.stats.wilcoxon(d, correction=True,
 * method='asymptotic'). The exact rule matches scipy 1.17's method='auto' for untied data.
 * `method` 'exact' or 'normal-cc' forces one branch ('exact' is refused with ties or n > 50).
 * NaN differences are skipped. p is NaN with no non-zero differences.
 * Cost O(n log n); the exact table for each n is built once (O(n³)) and cached.
 * Throws StatsInputError when a difference is infinite, or 'exact' is asked with ties or n > 50.
 */
export function wilcoxonSignedRank(
  differences: ArrayLike<number>,
  method: 'auto' | 'exact' | 'normal-cc' = 'auto',
): WilcoxonSignedRank {
  const absolute: number[] = [];
  const positive: boolean[] = [];
  let zeros = 0;
  for (let i = 0; i < differences.length; i++) {
    const d = differences[i] as number;
    if (Number.isNaN(d)) continue;
    if (!Number.isFinite(d)) throw new StatsInputError(`wilcoxonSignedRank: difference ${i} is ${d}`);
    if (d === 0) {
      zeros++;
      continue;
    }
    absolute.push(Math.abs(d));
    positive.push(d > 0);
  }
  const n = absolute.length;
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => (absolute[a] as number) - (absolute[b] as number));
  let wPlus = 0;
  let tieCorrection = 0;
  let hasTies = false;
  for (let start = 0; start < n; ) {
    let end = start + 1;
    while (end < n && absolute[order[end] as number] === absolute[order[start] as number]) end++;
    const size = end - start;
    const midRank = (start + 1 + end) / 2;
    if (size > 1) {
      hasTies = true;
      tieCorrection += size * size * size - size;
    }
    for (let i = start; i < end; i++) if (positive[order[i] as number]) wPlus += midRank;
    start = end;
  }
  const total = (n * (n + 1)) / 2;
  const wMinus = total - wPlus;
  const statistic = Math.min(wPlus, wMinus);
  let p = Number.NaN;
  let z = Number.NaN;
  const exactPossible = !hasTies && n <= exactMaxN;
  if (method === 'exact' && !exactPossible) {
    throw new StatsInputError(`wilcoxonSignedRank: the exact method needs untied |differences| and n ≤ ${exactMaxN}`);
  }
  const useExact = method === 'exact' || (method === 'auto' && exactPossible);
  if (n > 0 && useExact) {
    p = Math.min(1, 2 * (exactCdf(n)[statistic] as number));
  } else if (n > 0) {
    const mean = total / 2;
    const sd = Math.sqrt((n * (n + 1) * (2 * n + 1)) / 24 - tieCorrection / 48);
    const difference = statistic - mean;
    z = (difference - 0.5 * Math.sign(difference)) / sd;
    p = sd > 0 ? Math.min(1, 2 * normalCdf(-Math.abs(z))) : Number.NaN;
  }
  return { n, zerosDropped: zeros, wPlus, wMinus, statistic, p, z, method: useExact ? 'exact' : 'normal-cc' };
}
