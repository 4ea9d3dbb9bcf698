/**
 * Sample quantile of an ascending array by linear interpolation between order statistics,
 * Hyndman & Fan (1996) definition 7 (R's default `quantile(type = 7)`, numpy's 'linear'):
 * h = (n − 1)·p, Q = x[⌊h⌋] + (h − ⌊h⌋)·(x[⌊h⌋ + 1] − x[⌊h⌋]). NaN for an empty array or p outside
 * [0, 1]. The input must be sorted and free of NaN (not checked: O(1)).
 */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0 || !(p >= 0 && p <= 1)) return Number.NaN;
  const h = (n - 1) * p;
  const lower = Math.floor(h);
  const fraction = h - lower;
  const low = sorted[lower] as number;
  if (fraction === 0) return low;
  return low + fraction * ((sorted[lower + 1] as number) - low);
}
