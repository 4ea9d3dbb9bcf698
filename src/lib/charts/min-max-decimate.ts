/**
 * Reduces a uniformly sampled signal to at most two points (the minimum and the maximum, in time
 * order) per bucket of `bucketSize` samples, so a chart draws about one min/max pair per pixel without
 * losing peaks. Returns the kept sample indices. Cost: O(n), one output allocation.
 */
export function minMaxDecimate(values: Float64Array, start: number, end: number, bucketCount: number): Int32Array {
  const n = end - start;
  if (n <= 2 * bucketCount) {
    const all = new Int32Array(Math.max(0, n));
    for (let i = 0; i < n; i++) all[i] = start + i;
    return all;
  }
  const out = new Int32Array(2 * bucketCount);
  let count = 0;
  for (let b = 0; b < bucketCount; b++) {
    const from = start + Math.floor((b * n) / bucketCount);
    const to = start + Math.floor(((b + 1) * n) / bucketCount);
    let minIndex = from;
    let maxIndex = from;
    for (let i = from + 1; i < to; i++) {
      const v = values[i] as number;
      if (v < (values[minIndex] as number)) minIndex = i;
      if (v > (values[maxIndex] as number)) maxIndex = i;
    }
    const first = Math.min(minIndex, maxIndex);
    const second = Math.max(minIndex, maxIndex);
    out[count++] = first;
    if (second !== first) out[count++] = second;
  }
  return out.subarray(0, count);
}
