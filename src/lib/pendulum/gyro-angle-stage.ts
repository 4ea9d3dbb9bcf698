import { RecordingInputError } from '../domain';
import { roundTo } from '../stats';
import { angleStage, type AngleStage } from './angle-stage';
import { MIN_DROP_VELOCITY_DPS } from './detect-release';
import { integrateGyro } from './integrate-gyro';
import { medianInPlace } from './quickselect';
import type { UniformGrid } from './uniform-grid';

/** The angle stage of a gyro-only recording and the gyro bias removed at each grid sample (deg/s). */
export interface GyroAngleStage {
  readonly stage: AngleStage;
  readonly bias: (i: number) => number;
}

/**
 * Gyro-only input: integrate the gyro after removing a bias estimated from the still periods before
 * release and after rest, in two passes (the rest plateau found in the first pass pins the bias in
 * the second), with the angle at the hold set to `startAngle`. Throws RecordingInputError when the
 * leg never falls, and whatever angleStage throws.
 */
export function gyroAngleStage(file: string, gyro: Float64Array, filtered: Float64Array, grid: UniformGrid, startAngle: number, lastLine: number, warnings: string[]): GyroAngleStage {
  const fs = grid.rateHz;
  const m = gyro.length;
  let peak = 0;
  for (let i = 1; i < m; i++) if (filtered[i] > filtered[peak]) peak = i;
  if (!(filtered[peak] >= MIN_DROP_VELOCITY_DPS)) {
    throw new RecordingInputError(
      file,
      null,
      `no release found: the leg never falls (fastest flexion ${roundTo(filtered[peak], 1)} deg/s in gyro_dps, a drop reaches at least ${MIN_DROP_VELOCITY_DPS} deg/s)`,
    );
  }
  const threshold = Math.max(5, 0.05 * filtered[peak]);
  let onset = peak;
  while (onset > 0 && filtered[onset] > threshold) onset--;
  // Still period before release: back from the onset while the filtered gyro stays within 5 deg/s
  // of its value there, at most 3 s. The bias is the mean over it (the least-squares estimate:
  // it makes the integrated angle flat over the hold).
  const preEnd = Math.max(0, onset - Math.round(0.05 * fs));
  let preStart = preEnd;
  const still = preEnd > 0 ? filtered[preEnd] : 0;
  while (preStart > 0 && preEnd - preStart < 3 * fs && Math.abs(filtered[preStart - 1] - still) <= 5) preStart--;
  let biasPre = 0;
  let anchorPre = 0;
  if (preEnd - preStart >= Math.max(3, Math.round(0.1 * fs))) {
    biasPre = meanOf(gyro, preStart, preEnd);
    anchorPre = (preStart + preEnd) / 2;
  } else {
    warnings.push('no still period before release; the gyro bias before release was not estimated');
  }
  // First pass: the final half second pins the bias at the end (a recording ends at rest).
  const tail = Math.max(3, Math.round(0.5 * fs));
  const scratch = new Float64Array(tail);
  scratch.set(gyro.subarray(m - tail, m));
  let biasPost = medianInPlace(scratch);
  let anchorPost = m - tail / 2;
  const angleRaw = new Float64Array(m);
  const build = (): AngleStage => {
    integrateGyro(gyro, fs, biasPre, anchorPre, biasPost, anchorPost, 0, angleRaw);
    const reference = preEnd - preStart >= 3 ? meanOf(angleRaw, preStart, preEnd) : angleRaw[Math.max(onset, 0)];
    for (let i = 0; i < m; i++) angleRaw[i] += startAngle - reference;
    return angleStage(file, angleRaw, grid, lastLine);
  };
  let stage = build();
  // Second pass: the still period after rest is the last (up to) 3 s of the detected plateau, where
  // any residual wobble is smallest; the mean gyro there is the bias that keeps the angle flat.
  const plateauEnd = stage.rest.endIndex;
  const plateauStart = Math.max(stage.rest.onsetIndex, plateauEnd - Math.round(3 * fs));
  if (plateauEnd - plateauStart >= Math.round(0.3 * fs)) {
    biasPost = meanOf(gyro, plateauStart, plateauEnd);
    anchorPost = (plateauStart + plateauEnd) / 2;
    if (!(anchorPre > 0 || preEnd - preStart >= 3)) biasPre = biasPost;
    stage = build();
  }
  const [a, b, span] = [biasPre, biasPost, anchorPost - anchorPre];
  const bias = (i: number): number => (span <= 0 || i <= anchorPre ? a : i >= anchorPost ? b : a + ((b - a) * (i - anchorPre)) / span);
  return { stage, bias };
}

function meanOf(values: Float64Array, from: number, to: number): number {
  let sum = 0;
  for (let i = from; i < to; i++) sum += values[i];
  return sum / (to - from);
}
