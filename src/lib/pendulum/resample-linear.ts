/**
 * Resamples `values` given at increasing times `timeS` onto the uniform grid
 * t_k = startS + k / rateHz, k = 0..out.length-1, by linear interpolation (values beyond the last
 * sample hold the last value). One forward pass, O(n + m), no allocation: the caller passes `out`.
 * Linear interpolation is enough here because the signals are later low-pass filtered far below
 * the sampling rate; it neither overshoots nor invents extrema.
 */
export function resampleLinear(
  timeS: Float64Array,
  values: Float64Array,
  startS: number,
  rateHz: number,
  out: Float64Array,
): Float64Array {
  const n = timeS.length;
  let j = 0;
  for (let k = 0; k < out.length; k++) {
    const t = startS + k / rateHz;
    while (j < n - 2 && timeS[j + 1] <= t) j++;
    if (n === 1) {
      out[k] = values[0];
      continue;
    }
    const t0 = timeS[j];
    const t1 = timeS[j + 1];
    if (t <= t0) out[k] = values[j];
    else if (t >= t1) out[k] = values[j + 1];
    else out[k] = values[j] + ((values[j + 1] - values[j]) * (t - t0)) / (t1 - t0);
  }
  return out;
}
