/** The final plateau. */
export interface RestPlateau {
  /** First sample of the first window in which the leg is still. */
  readonly onsetIndex: number;
  /** One past the last sample of the plateau (the leg left the band or the recording ended). */
  readonly endIndex: number;
  /** Mean filtered angle over the plateau, at most its first 5 s (deg). */
  readonly restAngleDeg: number;
}

/**
 * Length of the stillness window (s): about one swing period (0.7–1.2 s), so that a slow residual
 * oscillation cannot pass the test by sitting on one turning point.
 */
export const REST_WINDOW_S = 1;

/**
 * Finds when the leg has come to rest, and its resting angle.
 *
 * Stability test (this project's; common practice in spirit): the leg is at rest from the first
 * sample `i ≥ from` for which the filtered angle stays within a band of `toleranceDeg` (max − min)
 * for the next `windowS` seconds (default REST_WINDOW_S). The plateau then runs while the angle stays within ±toleranceDeg of that
 * window's mean; the resting angle is the mean over the plateau (at most 5 s), which averages out
 * any remaining sub-degree wobble and noise.
 *
 * Sliding max/min with monotone deques: O(n); allocates two index queues. `scratch` may be passed
 * to avoid that (length ≥ 2n). Returns null when no such window exists (the recording ends before
 * the leg comes to rest).
 */
export function detectRest(
  angleDeg: Float64Array,
  sampleRateHz: number,
  from: number,
  toleranceDeg: number,
  windowS: number = REST_WINDOW_S,
  scratch: Int32Array = new Int32Array(2 * angleDeg.length),
): RestPlateau | null {
  const n = angleDeg.length;
  const window = Math.max(3, Math.round(windowS * sampleRateHz));
  const maxQueue = scratch.subarray(0, n);
  const minQueue = scratch.subarray(n, 2 * n);
  let maxHead = 0;
  let maxTail = 0;
  let minHead = 0;
  let minTail = 0;
  let onset = -1;
  for (let e = from; e < n; e++) {
    const v = angleDeg[e];
    while (maxTail > maxHead && angleDeg[maxQueue[maxTail - 1]] <= v) maxTail--;
    maxQueue[maxTail++] = e;
    while (minTail > minHead && angleDeg[minQueue[minTail - 1]] >= v) minTail--;
    minQueue[minTail++] = e;
    const s = e - window + 1;
    if (s < from) continue;
    while (maxQueue[maxHead] < s) maxHead++;
    while (minQueue[minHead] < s) minHead++;
    if (angleDeg[maxQueue[maxHead]] - angleDeg[minQueue[minHead]] <= toleranceDeg) {
      onset = s;
      break;
    }
  }
  if (onset < 0) return null;
  let windowMean = 0;
  for (let i = onset; i < onset + window; i++) windowMean += angleDeg[i];
  windowMean /= window;
  let end = onset + window;
  while (end < n && Math.abs(angleDeg[end] - windowMean) <= toleranceDeg) end++;
  const meanEnd = Math.min(end, onset + Math.max(window, Math.round(5 * sampleRateHz)));
  let sum = 0;
  for (let i = onset; i < meanEnd; i++) sum += angleDeg[i];
  return { onsetIndex: onset, endIndex: end, restAngleDeg: sum / (meanEnd - onset) };
}
