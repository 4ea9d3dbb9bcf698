import { RecordingInputError } from '../domain';
import { roundTo } from '../stats';
import { centralDifference } from './central-difference';
import { detectRelease, MIN_DROP_VELOCITY_DPS, type Release } from './detect-release';
import { detectRest, REST_WINDOW_S, type RestPlateau } from './detect-rest';
import { medianInPlace } from './quickselect';
import type { UniformGrid } from './uniform-grid';
import { edgePad } from './uniform-grid';
import { zeroPhaseFilter } from './zero-phase-filter';

const SHORT_REST_WINDOW_S = 0.5;

/** The filtered angle on the grid with its velocity, release and rest plateau. */
export interface AngleStage {
  readonly angleDeg: Float64Array;
  readonly velocityDps: Float64Array;
  readonly release: Release;
  readonly rest: RestPlateau;
  readonly filteredNoiseDeg: number;
  readonly restToleranceDeg: number;
}

/**
 * Low-pass the resampled angle (zero phase), estimate the noise left in it, differentiate, and find
 * the release (detectRelease) and the rest plateau (detectRest; a shorter window with half the band
 * when the recording stops soon after the leg settles). Throws RecordingInputError for no release, a
 * recording that starts while the leg is already falling, or one that ends before the leg is at rest.
 */
export function angleStage(file: string, angleRaw: Float64Array, grid: UniformGrid, lastLine: number): AngleStage {
  const { rateHz: fs, cutoffHz } = grid;
  const m = angleRaw.length;
  const angleDeg = zeroPhaseFilter(grid.sos, angleRaw, new Float64Array(m), edgePad(fs, cutoffHz));
  // Noise: robust spread of what the filter removed, scaled to the share of white noise it keeps.
  // Every k-th sample (at most ~4000) estimates a noise level as well as all of them.
  const stride = Math.max(1, Math.floor(m / 4000));
  const residual = new Float64Array(Math.ceil(m / stride));
  for (let i = 0, j = 0; i < m; i += stride, j++) residual[j] = Math.abs(angleRaw[i] - angleDeg[i]);
  const removedNoise = 1.4826 * medianInPlace(residual);
  const kept = Math.min(0.8, (2 * cutoffHz) / fs);
  const filteredNoiseDeg = removedNoise * Math.sqrt(kept / (1 - kept));
  const velocityDps = centralDifference(angleDeg, fs, new Float64Array(m));
  const release = detectRelease(angleDeg, velocityDps, fs);
  if (!release) {
    let fastest = 0;
    for (let i = 0; i < m; i++) if (velocityDps[i] > fastest) fastest = velocityDps[i];
    throw new RecordingInputError(
      file,
      null,
      `no release found: the leg never falls (fastest flexion ${roundTo(fastest, 1)} deg/s, a drop reaches at least ${MIN_DROP_VELOCITY_DPS} deg/s)`,
    );
  }
  let top = release.peakVelocityIndex;
  while (top < m - 1 && velocityDps[top] > 0) top++;
  const restToleranceDeg = Math.max(1, 6 * filteredNoiseDeg);
  // A recording may stop soon after the leg settles: then half the window with half the band.
  const rest =
    detectRest(angleDeg, fs, top, restToleranceDeg) ??
    detectRest(angleDeg, fs, top, Math.max(0.5, 0.5 * restToleranceDeg), SHORT_REST_WINDOW_S);
  if (!rest) {
    throw new RecordingInputError(
      file,
      lastLine,
      `the recording ends before the leg has come to rest (no ${REST_WINDOW_S} s stretch after the first swing stays within ${roundTo(restToleranceDeg, 2)}°)`,
    );
  }
  if (release.peakVelocityIndex - release.index < 2 && release.onsetIndex === 0) {
    throw new RecordingInputError(file, null, 'no release found: the recording starts while the leg is already falling');
  }
  return { angleDeg, velocityDps, release, rest, filteredNoiseDeg, restToleranceDeg };
}
