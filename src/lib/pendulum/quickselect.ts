import { selectInPlace } from '../stats';

/**
 * Returns the k-th smallest value (0-based, counted from the array's start) of values[from..to),
 * reordering that range in place: stats' selectInPlace (Hoare's quickselect, median-of-three
 * pivots; expected O(n), no allocation) with the rank checked.
 * Throws RangeError when k is outside from..to-1. NaN values must be removed by the caller.
 */
export function quickselect(values: Float64Array, k: number, from = 0, to = values.length): number {
  if (k < from || k >= to) throw new RangeError(`quickselect: k = ${k} outside ${from}..${to - 1}`);
  return selectInPlace(values, k - from, from, to);
}

/** Median of `values[from..to)`, reordering that range in place (lower-upper average for even counts). */
export function medianInPlace(values: Float64Array, from = 0, to = values.length): number {
  const n = to - from;
  if (n <= 0) return Number.NaN;
  const half = from + (n >> 1);
  const upper = quickselect(values, half, from, to);
  if (n % 2 === 1) return upper;
  // The lower middle is the largest value left of `half` after selection.
  let lower = -Infinity;
  for (let i = from; i < half; i++) if (values[i] > lower) lower = values[i];
  return (lower + upper) / 2;
}
