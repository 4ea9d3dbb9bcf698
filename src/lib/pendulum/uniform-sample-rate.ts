import { medianInPlace } from './quickselect';

/** Sampling of a time column: the uniform rate the engine resamples to, and how irregular the input was. */
export interface SampleTiming {
  /** 1 / median interval, snapped to a whole number of Hz when within 0.5 % of one. */
  readonly rateHz: number;
  /** Longest interval between consecutive samples (s). */
  readonly maxIntervalS: number;
  /** Largest relative deviation of an interval from the median interval. */
  readonly maxJitter: number;
}

/**
 * Estimates the sampling rate of an increasing time column as 1 / (median interval); the median
 * ignores occasional gaps and duplicated-clock jitter. Snapping to whole Hz (common practice for
 * logging devices whose clocks run at nominal rates) keeps the resampling grid on round numbers.
 * Cost: O(n) (selection, not sorting). Returns rateHz NaN for fewer than two samples.
 */
export function uniformSampleRate(timeS: Float64Array): SampleTiming {
  const n = timeS.length;
  if (n < 2) return { rateHz: Number.NaN, maxIntervalS: Number.NaN, maxJitter: Number.NaN };
  let maxIntervalS = 0;
  let minIntervalS = Infinity;
  for (let i = 1; i < n; i++) {
    const dt = timeS[i] - timeS[i - 1];
    if (dt > maxIntervalS) maxIntervalS = dt;
    if (dt < minIntervalS) minIntervalS = dt;
  }
  // Regular clocks (the common case) need no selection: every interval is the median to rounding.
  let medianS: number;
  if (maxIntervalS - minIntervalS <= 1e-9 * maxIntervalS + 1e-12) {
    medianS = (timeS[n - 1] - timeS[0]) / (n - 1);
  } else {
    const intervals = new Float64Array(n - 1);
    for (let i = 1; i < n; i++) intervals[i - 1] = timeS[i] - timeS[i - 1];
    medianS = medianInPlace(intervals);
  }
  let rateHz = 1 / medianS;
  const whole = Math.round(rateHz);
  if (whole > 0 && Math.abs(rateHz - whole) <= 0.005 * rateHz) rateHz = whole;
  const maxJitter = Math.max(maxIntervalS / medianS - 1, 1 - minIntervalS / medianS);
  return { rateHz, maxIntervalS, maxJitter };
}
