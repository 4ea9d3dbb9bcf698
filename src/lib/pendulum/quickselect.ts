/**
 * Returns the k-th smallest value (0-based) of `values`, reordering `values` in place.
 * Method: Hoare's selection (quickselect) with median-of-three pivots; expected O(n), no allocation.
 * Throws RangeError when k is outside 0..n-1. NaN values must be removed by the caller.
 */
export function quickselect(values: Float64Array, k: number, from = 0, to = values.length): number {
  if (k < from || k >= to) throw new RangeError(`quickselect: k = ${k} outside ${from}..${to - 1}`);
  let left = from;
  let right = to - 1;
  while (right > left) {
    const mid = (left + right) >> 1;
    // Median of three as pivot keeps sorted and reverse-sorted input at O(n).
    const a = values[left];
    const b = values[mid];
    const c = values[right];
    const pivot = Math.max(Math.min(a, b), Math.min(Math.max(a, b), c));
    let i = left;
    let j = right;
    while (i <= j) {
      while (values[i] < pivot) i++;
      while (values[j] > pivot) j--;
      if (i <= j) {
        const t = values[i];
        values[i] = values[j];
        values[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else return values[k];
  }
  return values[k];
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
