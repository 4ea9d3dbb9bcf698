/**
 * Moves the k-th smallest of values[from..to) (0-based rank k counted from `from`) to position
 * from + k, with everything before it ≤ and everything after it ≥, and returns it.
 * Method: Hoare-partition quickselect with median-of-three pivots (Hoare 1961, "Algorithm 65:
 * FIND"); expected O(n), no allocation. NaN must not be present (comparisons with NaN are false).
 * Later selections can reuse the partition: a rank below k needs only [from, from + k).
 */
export function selectInPlace(values: Float64Array, k: number, from = 0, to = values.length): number {
  let left = from;
  let right = to - 1;
  const target = from + k;
  while (right > left) {
    // Median of three as pivot guards against sorted and reverse-sorted input.
    const mid = (left + right) >>> 1;
    // Median of three without destructuring swaps (they allocate in hot loops).
    const a = values[left] as number;
    const b = values[mid] as number;
    const c = values[right] as number;
    const pivot = a < b ? (b < c ? b : a < c ? c : a) : a < c ? a : b < c ? c : b;
    let i = left;
    let j = right;
    while (i <= j) {
      while ((values[i] as number) < pivot) i++;
      while ((values[j] as number) > pivot) j--;
      if (i <= j) {
        const swap = values[i] as number;
        values[i] = values[j] as number;
        values[j] = swap;
        i++;
        j--;
      }
    }
    if (target <= j) right = j;
    else if (target >= i) left = i;
    else break;
  }
  return values[target] as number;
}
