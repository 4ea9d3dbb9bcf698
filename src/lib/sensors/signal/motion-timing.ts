import { medianInPlace } from '../../pendulum';

/** Sampling facts of a recording's time stamps. */
export interface MotionTiming {
  /** 1000 / median interval (Hz); NaN with fewer than two samples. */
  readonly rateHz: number;
  readonly medianIntervalMs: number;
  /** Samples missing from gaps longer than 1.5 median intervals: Σ (round(gap / median) − 1). */
  readonly droppedSamples: number;
  /** Longest interval between consecutive samples (ms). */
  readonly longestGapMs: number;
  /** Duration from the first to the last sample (ms). */
  readonly durationMs: number;
}

/** Rate under which a recording is flagged: the swing's fast first half-second needs more (common practice). */
export const LOW_RATE_HZ = 50;

/**
 * Rate, dropped samples and gaps from time stamps (ms).
 *
 * Browsers stamp sensor events with a few milliseconds of jitter around a regular sensor clock (±3 ms
 * at 100 Hz is common), so a single long interval cannot tell a late event from a missing one: 16 ms
 * after a 4 ms one is jitter, not a drop. Method: give each sample its slot on the sensor's clock,
 * k, with T and t0 fitted by least squares to (slot, time)
 * online, each slot counted from the fitted clock's time of the previous slot (starting from the
 * median interval); dropped samples are the empty slots. Only when a stamp strays from the fitted
 * clock by more than 0.45 interval (an irregular clock) does it fall
 * back to counting each gap of k ≥ 1.5 median intervals as round(k) − 1. O(n); allocates three copies.
 * Assumes strictly increasing times (parseMotionCsv and the live buffer guarantee it).
 */
export function motionTiming(timeMs: Float64Array): MotionTiming {
  const n = timeMs.length;
  if (n < 2) return { rateHz: Number.NaN, medianIntervalMs: Number.NaN, droppedSamples: 0, longestGapMs: 0, durationMs: 0 };
  const intervals = new Float64Array(n - 1);
  let longest = 0;
  for (let i = 1; i < n; i++) {
    intervals[i - 1] = timeMs[i] - timeMs[i - 1];
    if (intervals[i - 1] > longest) longest = intervals[i - 1];
  }
  const durationMs = timeMs[n - 1] - timeMs[0];
  const median = medianInPlace(intervals);
  // Online least squares of time on slot: each sample's slot is counted from where the fitted clock
  // puts the previous slot (jitter-free), never from the previous, jittered stamp.
  // Until 20 samples pin the fit, the clock is the median interval phased by the median offset of
  // the first 20 stamps (a least-squares slope through fewer jittered points is too loose).
  const head = Math.min(n, 20);
  const offsets = new Float64Array(head);
  for (let i = 0; i < head; i++) offsets[i] = timeMs[i] - median * i;
  let origin = medianInPlace(offsets);
  let period = median;
  const slots = new Float64Array(n);
  slots[0] = Math.round((timeMs[0] - origin) / period);
  let sx = slots[0];
  let sy = timeMs[0];
  let sxx = slots[0] * slots[0];
  let sxy = slots[0] * timeMs[0];
  let worst = 0;
  for (let i = 1; i < n; i++) {
    const previousOnClock = origin + period * slots[i - 1];
    slots[i] = slots[i - 1] + Math.max(1, Math.round((timeMs[i] - previousOnClock) / period));
    sx += slots[i];
    sy += timeMs[i];
    sxx += slots[i] * slots[i];
    sxy += slots[i] * timeMs[i];
    const count = i + 1;
    const denominator = count * sxx - sx * sx;
    if (i >= 20 && denominator > 0) {
      period = (count * sxy - sx * sy) / denominator;
      origin = (sy - period * sx) / count;
    }
  }
  for (let i = 0; i < n; i++) worst = Math.max(worst, Math.abs(timeMs[i] - (origin + period * slots[i])));
  const regular = period > 0 && worst < 0.45 * period;
  let dropped = 0;
  if (regular) {
    dropped = slots[n - 1] - slots[0] + 1 - n;
  } else {
    for (let i = 1; i < n; i++) {
      const k = (timeMs[i] - timeMs[i - 1]) / median;
      if (k >= 1.5) dropped += Math.round(k) - 1;
    }
  }
  const interval = regular ? period : median;
  return { rateHz: 1000 / interval, medianIntervalMs: median, droppedSamples: dropped, longestGapMs: longest, durationMs };
}
