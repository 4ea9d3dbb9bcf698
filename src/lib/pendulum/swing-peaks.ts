import type { AngleStage } from './angle-stage';
import { REST_WINDOW_S } from './detect-rest';
import { prominentPeaks } from './prominent-peaks';

/** A flexion peak counts when it passes the resting angle by more than this (deg). */
export const PEAK_COUNT_MARGIN_DEG = 1;

/** The swing's extrema between release and the start of the rest plateau (grid indices). */
export interface SwingPeaks {
  readonly flexionPeaks: Int32Array;
  readonly extensionPeaks: Int32Array;
  /** Grid index of the first flexion peak (or where the first downswing stalled). */
  readonly firstPeakIndex: number;
  /** Its fractional index and angle after parabolic refinement. */
  readonly firstPeakAt: number;
  readonly firstPeakDeg: number;
  /** Flexion peaks from the first one on that pass rest by PEAK_COUNT_MARGIN_DEG. */
  readonly peakCount: number;
  /** Time between the first two counted flexion peaks (s), null with fewer than two. */
  readonly firstPeriodS: number | null;
}

/**
 * Step 4 of analysePendulumTrace: flexion maxima and extension minima by prominence (at least four
 * times the filtered noise, 0.5° at the least); the first flexion peak is the first prominent maximum
 * after the fastest flexion, else where the downswing stalled (with a warning); then the peak count
 * and the first period.
 */
export function swingPeaks(stage: AngleStage, fs: number, warnings: string[]): SwingPeaks {
  const { angleDeg, velocityDps, release, rest } = stage;
  const m = angleDeg.length;
  const i0 = Math.min(Math.ceil(release.index), m - 1);
  const extremaEnd = Math.min(m, rest.onsetIndex + Math.max(3, Math.round(REST_WINDOW_S * fs)));
  const minProminence = Math.max(0.5, 4 * stage.filteredNoiseDeg);
  const capacity = Math.max(4, Math.ceil(((extremaEnd - i0) / fs) * 20));
  const maxBuffer = new Int32Array(capacity);
  const minBuffer = new Int32Array(capacity);
  const flexionPeaks = maxBuffer.slice(0, prominentPeaks(angleDeg, i0, extremaEnd, minProminence, maxBuffer, 1));
  const extensionPeaks = minBuffer.slice(0, prominentPeaks(angleDeg, i0, extremaEnd, minProminence, minBuffer, -1));

  let firstPeakIndex = -1;
  let firstPeakAt = Number.NaN;
  let firstPeakDeg = Number.NaN;
  for (const p of flexionPeaks) {
    if (p > release.peakVelocityIndex) {
      firstPeakIndex = p;
      [firstPeakAt, firstPeakDeg] = refineExtremum(angleDeg, p);
      break;
    }
  }
  if (firstPeakIndex < 0) {
    let i = release.peakVelocityIndex;
    const stall = 0.1 * velocityDps[release.peakVelocityIndex];
    while (i < rest.onsetIndex && !(velocityDps[i] <= stall && velocityDps[i] <= velocityDps[i + 1])) i++;
    [firstPeakIndex, firstPeakAt, firstPeakDeg] = [i, i, angleDeg[i]];
    warnings.push('the first swing did not turn back before rest; the first peak is taken where the downswing stalled');
  }
  const { peakCount, firstPeriodS } = countFlexionPeaks(angleDeg, flexionPeaks, firstPeakIndex, rest.restAngleDeg, fs);
  return { flexionPeaks, extensionPeaks, firstPeakIndex, firstPeakAt, firstPeakDeg, peakCount, firstPeriodS };
}

function countFlexionPeaks(angleDeg: Float64Array, flexionPeaks: Int32Array, firstPeakIndex: number, restAngle: number, fs: number): { peakCount: number; firstPeriodS: number | null } {
  let peakCount = 0;
  let firstPeriodS: number | null = null;
  let firstCountingAt = Number.NaN;
  for (const p of flexionPeaks) {
    if (p < firstPeakIndex) continue;
    const [at, value] = refineExtremum(angleDeg, p);
    if (!(value - restAngle > PEAK_COUNT_MARGIN_DEG)) continue;
    peakCount++;
    // First period: between the first two flexion peaks that pass rest by the margin, whichever they
    // are (an early catch in an extension-type leg can make the very first maximum fall short).
    if (peakCount === 1) firstCountingAt = at;
    else if (peakCount === 2) firstPeriodS = (at - firstCountingAt) / fs;
  }
  return { peakCount, firstPeriodS };
}

/** Parabolic interpolation through the three samples around an extremum: [fractional index, value]. */
function refineExtremum(values: Float64Array, i: number): [number, number] {
  if (i <= 0 || i >= values.length - 1) return [i, values[i]];
  const left = values[i - 1];
  const centre = values[i];
  const right = values[i + 1];
  const curvature = left - 2 * centre + right;
  if (curvature === 0) return [i, centre];
  const offset = Math.max(-0.5, Math.min(0.5, (0.5 * (left - right)) / curvature));
  return [i + offset, centre - 0.25 * (left - right) * offset];
}
