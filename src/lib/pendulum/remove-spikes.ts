import { medianInPlace } from './quickselect';

/**
 * Replaces isolated outliers ("spikes": single- or two-sample glitches of a sensor or a logger)
 * with the median of their five-sample neighbourhood, in place. A sample is a spike when it
 * differs from that running median by more than max(floor, 8 × robust spread), the robust spread
 * being 1.4826 × the median absolute deviation of the sample-minus-median differences (of every
 * k-th sample on long signals)
 * (a Hampel-type identifier; Hampel 1974, from memory). A five-sample median passes monotone stretches
 * and smooth extrema unchanged, so real swings are not touched.
 *
 * Cost: O(n), one scratch array of n. Returns the number of samples replaced. `floor` is in the
 * signal's unit and keeps ordinary noise from being called a spike in near-noiseless recordings.
 */
export function removeSpikes(values: Float64Array, floor: number): number {
  const n = values.length;
  if (n < 5) return 0;
  const deviation = new Float64Array(n);
  for (let i = 0; i < n; i++) deviation[i] = values[i] - median5At(values, i);
  // The spread is a property of the noise, so every k-th sample (at most ~4000) estimates it as well.
  const stride = Math.max(1, Math.floor(n / 4000));
  const absolute = new Float64Array(Math.ceil(n / stride));
  for (let i = 0, j = 0; i < n; i += stride, j++) absolute[j] = Math.abs(deviation[i]);
  const spread = 1.4826 * medianInPlace(absolute);
  const limit = Math.max(floor, 8 * spread);
  let replaced = 0;
  for (let i = 0; i < n; i++) {
    if (Math.abs(deviation[i]) > limit) {
      values[i] = values[i] - deviation[i];
      replaced++;
    }
  }
  return replaced;
}

/** Median of the five samples centred on i (the window is shifted inward at the ends). O(1), no allocation. */
export function median5At(x: Float64Array, i: number): number {
  const n = x.length;
  const s = Math.min(Math.max(i - 2, 0), n - 5);
  let a = x[s];
  let b = x[s + 1];
  let c = x[s + 2];
  let d = x[s + 3];
  const e = x[s + 4];
  let t: number;
  // The smallest of any four of five values cannot be their median: drop it twice, then the
  // median is the smaller of the two candidates left (no sorting, no allocation).
  if (a > b) { t = a; a = b; b = t; }
  if (c > d) { t = c; c = d; d = t; }
  if (a > c) {
    // Drop c; the pair (a, b) becomes the second pair, d the first pair's survivor.
    t = b;
    b = d;
    c = a;
    d = t;
  }
  // Pairs (e, b) and (c, d), each sorted after this swap; drop the smaller head.
  let f = e;
  if (f > b) { t = f; f = b; b = t; }
  return f > c ? Math.min(d, f) : Math.min(b, c);
}
