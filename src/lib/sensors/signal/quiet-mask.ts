/**
 * Marks the samples around which the device was quiet: within ±halfWindowMs of sample i, every
 * rotation-rate magnitude is under maxRateDps and every acceleration magnitude is within
 * maxGravityErrorMs2 of gravityMs2. Writes 1 (quiet) or 0 into `out` and returns it.
 *
 * Used twice: narrow and strict to find still periods (gyro bias, the held start, rest), and wide to
 * decide when the accelerometer can be trusted as a gravity sensor. Why both tests: during a swing
 * the tangential acceleration mostly turns the measured vector without changing its length, so
 * |a| ≈ g alone would let it through; slow rotation over a window of about one swing period rules
 * it out. Two-pointer sliding window over "bad" samples: O(n), no allocation beyond `out`.
 */
export function quietMask(
  timeMs: Float64Array,
  rateMagnitudeDps: Float64Array,
  accelerationMagnitudeMs2: Float64Array,
  gravityMs2: number,
  maxRateDps: number,
  maxGravityErrorMs2: number,
  halfWindowMs: number,
  out: Uint8Array,
): Uint8Array {
  const n = timeMs.length;
  const bad = (j: number): number =>
    rateMagnitudeDps[j] >= maxRateDps || Math.abs(accelerationMagnitudeMs2[j] - gravityMs2) > maxGravityErrorMs2 ? 1 : 0;
  let lo = 0;
  let hi = 0;
  let badCount = 0;
  for (let i = 0; i < n; i++) {
    while (hi < n && timeMs[hi] <= timeMs[i] + halfWindowMs) badCount += bad(hi++);
    while (timeMs[lo] < timeMs[i] - halfWindowMs) badCount -= bad(lo++);
    out[i] = badCount === 0 ? 1 : 0;
  }
  return out;
}

/** Runs of consecutive 1s in a mask, as [start, end) index pairs, in order. */
export function maskRuns(mask: Uint8Array): Array<[number, number]> {
  const runs: Array<[number, number]> = [];
  let start = -1;
  for (let i = 0; i <= mask.length; i++) {
    const on = i < mask.length && mask[i] === 1;
    if (on && start < 0) start = i;
    else if (!on && start >= 0) {
      runs.push([start, i]);
      start = -1;
    }
  }
  return runs;
}
