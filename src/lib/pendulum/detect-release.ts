/** Where the leg was let go. */
export interface Release {
  /** Fractional sample index of the release instant. */
  readonly index: number;
  /** Held angle before release (deg). */
  readonly startAngleDeg: number;
  /** Sample of the fastest flexion (inside the first downswing). */
  readonly peakVelocityIndex: number;
  /** First sample of the movement (flexion speed above the onset threshold). */
  readonly onsetIndex: number;
  /** Length of the steady hold found before the onset (s); 0 when the leg was never still. */
  readonly holdS: number;
}

/** Slowest fastest-flexion that still counts as a drop (deg/s); a dropped leg reaches hundreds. */
export const MIN_DROP_VELOCITY_DPS = 30;
/** Band (deg) the angle must stay in to count as held. */
const HOLD_BAND_DEG = 1.5;

/**
 * Finds the release: the end of the hold at the starting angle.
 *
 * Method (this project's; no published algorithm is followed):
 * 1. The drop is the fastest flexion of the recording (gravity accelerates a released leg faster than
 *    an examiner moves it); walk back from it to the motion onset, the last sample whose flexion
 *    speed is under max(5 deg/s, 5 % of that peak).
 * 2. The starting angle is the mean of the steady hold before the onset (the stretch within
 *    ±1.5° of the onset angle, up to 1 s, excluding the last 30 ms); without a steady hold, the
 *    lowest angle just before the fall.
 * 3. Just after release gravity gives nearly constant angular acceleration, so θ − θstart ≈ c·(t − t0)²
 *    and √(θ − θstart) is linear in t. A least-squares line through √(θ − θstart) over the part of the
 *    fall between 2° and min(12°, 30 % of the fall) past the start extrapolates back to t0. This avoids
 *    both the rounding of the corner by the low-pass filter and any fixed velocity threshold.
 *
 * Input: low-pass-filtered angle and its velocity on a uniform grid. Returns null when there is no
 * drop (the fastest flexion is under 30 deg/s). O(n), no allocation.
 */
export function detectRelease(angleDeg: Float64Array, velocityDps: Float64Array, sampleRateHz: number): Release | null {
  const n = angleDeg.length;
  let peakVelocityIndex = 0;
  for (let i = 1; i < n; i++) if (velocityDps[i] > velocityDps[peakVelocityIndex]) peakVelocityIndex = i;
  const peakVelocity = velocityDps[peakVelocityIndex];
  if (!(peakVelocity >= MIN_DROP_VELOCITY_DPS)) return null;

  const onsetThreshold = Math.max(5, 0.05 * peakVelocity);
  let onsetIndex = peakVelocityIndex;
  while (onsetIndex > 0 && velocityDps[onsetIndex] > onsetThreshold) onsetIndex--;

  // Steady hold: walk back while the angle stays near the onset angle.
  const onsetAngle = angleDeg[onsetIndex];
  const maxHold = Math.round(sampleRateHz);
  let holdStart = onsetIndex;
  while (holdStart > 0 && onsetIndex - holdStart < maxHold && Math.abs(angleDeg[holdStart - 1] - onsetAngle) <= HOLD_BAND_DEG) holdStart--;
  const holdEnd = onsetIndex - Math.round(0.03 * sampleRateHz);
  let startAngleDeg: number;
  const holdS = (onsetIndex - holdStart) / sampleRateHz;
  if (holdEnd - holdStart >= Math.max(3, Math.round(0.1 * sampleRateHz))) {
    let sum = 0;
    for (let i = holdStart; i < holdEnd; i++) sum += angleDeg[i];
    startAngleDeg = sum / (holdEnd - holdStart);
  } else {
    startAngleDeg = onsetAngle;
    for (let i = Math.max(0, onsetIndex - Math.round(0.2 * sampleRateHz)); i <= peakVelocityIndex; i++) {
      if (angleDeg[i] < startAngleDeg) startAngleDeg = angleDeg[i];
    }
  }

  // Peak of the first downswing bounds the fit window.
  let firstTop = peakVelocityIndex;
  while (firstTop < n - 1 && velocityDps[firstTop] > 0) firstTop++;
  const fall = angleDeg[firstTop] - startAngleDeg;
  const low = 2;
  const high = Math.max(low + 1, Math.min(12, 0.3 * fall));
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  let count = 0;
  for (let i = onsetIndex; i <= peakVelocityIndex; i++) {
    const rise = angleDeg[i] - startAngleDeg;
    if (rise < low) continue;
    if (rise > high) break;
    const x = i;
    const y = Math.sqrt(rise);
    sx += x;
    sy += y;
    sxx += x * x;
    sxy += x * y;
    count++;
  }
  let index = onsetIndex;
  const denominator = count * sxx - sx * sx;
  if (count >= 3 && denominator > 0) {
    const slope = (count * sxy - sx * sy) / denominator;
    const intercept = (sy - slope * sx) / count;
    if (slope > 0) index = -intercept / slope;
  } else {
    // Too few samples in the window (very low rates): the last sample at or under the start.
    let i = onsetIndex;
    while (i < peakVelocityIndex && angleDeg[i + 1] - startAngleDeg < low) i++;
    index = i;
  }
  // The extrapolation must stay near the onset the velocity threshold found.
  const slack = 0.25 * sampleRateHz;
  index = Math.min(Math.max(index, onsetIndex - slack, 0), peakVelocityIndex);
  return { index, startAngleDeg, peakVelocityIndex, onsetIndex, holdS };
}
