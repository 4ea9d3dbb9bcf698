/**
 * Sorts values[from..to) ascending in place by insertion sort: no allocation (unlike
 * `subarray().sort()`, which creates a view), and fastest for the short ranges (≤ a few dozen
 * points per series) it is used for. O(m²) worst case for m = to − from. NaN must not be present.
 */
export function insertionSortRange(values: Float64Array, from: number, to: number): void {
  for (let i = from + 1; i < to; i++) {
    const value = values[i] as number;
    let j = i - 1;
    while (j >= from && (values[j] as number) > value) {
      values[j + 1] = values[j] as number;
      j--;
    }
    values[j + 1] = value;
  }
}
