/**
 * Finds the local maxima of values[from..to) whose topographic prominence is at least `minProminence`,
 * and writes their indices, in time order, into `out`; returns how many were found (at most out.length).
 *
 * Prominence (the definition used by scipy.signal.peak_prominences): from the peak, walk left until a
 * strictly higher sample or the range start, and take the lowest sample passed; do the same to the
 * right; the prominence is the peak height minus the higher of the two lowest points. A flat top
 * counts once, at its middle. A wiggle of noise has small prominence however high it sits, so a
 * swing is found by its size, not by single samples.
 *
 * Set `sign` to −1 to find minima (of −values). The walks stop as soon as the threshold is met, so
 * the cost stays near O(n) for ordinary traces. No allocation.
 */
export function prominentPeaks(
  values: Float64Array,
  from: number,
  to: number,
  minProminence: number,
  out: Int32Array,
  sign: 1 | -1 = 1,
): number {
  let count = 0;
  let i = from + 1;
  while (i < to - 1 && count < out.length) {
    const v = sign * values[i];
    if (!(v > sign * values[i - 1])) {
      i++;
      continue;
    }
    // Extend over a flat top.
    let j = i;
    while (j + 1 < to && sign * values[j + 1] === v) j++;
    if (j + 1 >= to || !(sign * values[j + 1] < v)) {
      i = j + 1;
      continue;
    }
    const peak = (i + j) >> 1;
    const limit = v - minProminence;
    if (sideReaches(values, i - 1, from - 1, -1, v, limit, sign) && sideReaches(values, j + 1, to, 1, v, limit, sign)) {
      out[count++] = peak;
    }
    i = j + 1;
  }
  return count;
}

/** True when walking from `start` by `step` reaches a value ≤ limit before a value > peak or the end. */
function sideReaches(values: Float64Array, start: number, stop: number, step: number, peak: number, limit: number, sign: number): boolean {
  for (let k = start; k !== stop; k += step) {
    const v = sign * values[k];
    if (v <= limit) return true;
    if (v > peak) return false;
  }
  return false;
}
