/**
 * First derivative of a uniformly sampled signal: central difference (x[i+1] − x[i−1])·fs/2 inside,
 * one-sided differences at the two ends. Used on the low-pass-filtered angle, so the noise gain of
 * differencing acts only on what the filter let through. O(n), writes `out`, returns it.
 */
export function centralDifference(values: Float64Array, sampleRateHz: number, out: Float64Array): Float64Array {
  const n = values.length;
  if (n === 0) return out;
  if (n === 1) {
    out[0] = 0;
    return out;
  }
  out[0] = (values[1] - values[0]) * sampleRateHz;
  out[n - 1] = (values[n - 1] - values[n - 2]) * sampleRateHz;
  const half = sampleRateHz / 2;
  for (let i = 1; i < n - 1; i++) out[i] = (values[i + 1] - values[i - 1]) * half;
  return out;
}
