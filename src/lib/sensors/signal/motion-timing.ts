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
 * Rate, dropped samples and gaps from time stamps (ms). The median interval is robust to the odd
 * late event; a gap of k median intervals (k ≥ 1.5) counts as round(k) − 1 dropped samples.
 * O(n) with quickselect; allocates one scratch copy of the intervals.
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
  let dropped = 0;
  for (let i = 1; i < n; i++) {
    const k = (timeMs[i] - timeMs[i - 1]) / median;
    if (k >= 1.5) dropped += Math.round(k) - 1;
  }
  return { rateHz: 1000 / median, medianIntervalMs: median, droppedSamples: dropped, longestGapMs: longest, durationMs };
}
