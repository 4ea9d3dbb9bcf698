import { roundTo } from '../stats';
import { cautionWarnings } from './caution-warnings';
import { checkTraceColumns } from './check-trace-columns';
import { emgStage } from './emg-summary';
import { fitSwing } from './fit-swing';
import type { PendulumAnalysis, PendulumEmgIndices } from './pendulum-result';
import type { PendulumOptions, PendulumTraceInput } from './pendulum-trace-input';
import { peakFlexionVelocity } from './peak-flexion-velocity';
import { dominantSide, sideAreas } from './side-areas';
import { swingPeaks } from './swing-peaks';
import { traceAngle } from './trace-angle';
import { uniformGrid } from './uniform-grid';

export type { PendulumOptions, PendulumTraceInput } from './pendulum-trace-input';

/** R2 of a typical relaxed leg (Bajd & Vodovnik 1984, from memory), for the normalised index. */
export const TYPICAL_RELAXATION_INDEX = 1.6;

/**
 * Analyses one knee pendulum recording and returns its indices and processed signals.
 *
 * Steps, one file each: check the columns (check-trace-columns); resample to a uniform rate
 * (uniform-grid: 1 / median interval, linear interpolation); replace isolated spikes and low-pass the
 * angle (trace-angle, angle-stage: ANGLE_CUTOFF_HZ, zero phase); for gyro-only input, integrate the
 * gyro after removing a bias estimated from the still periods before release and after rest
 * (gyro-angle-stage: two passes, the rest plateau found in the first pins the bias in the second);
 * find the release (detectRelease), the rest plateau (detectRest), the flexion and extension
 * extrema by prominence (swing-peaks); compute the indices listed in PendulumIndices (side-areas,
 * peak-flexion-velocity); fit a damped cosine (fit-swing: fitDampedCosine from release to one second
 * into the plateau, at about 100 Hz); with EMG, envelope, baseline threshold and bursts per swing
 * phase (emg-summary); cautions (caution-warnings). Every index is defined in pendulum-result.ts.
 * No index grades the leg; `warnings` says in words what looks unusual.
 *
 * Cost: O(n) apart from the fit (bounded iterations over ≤ 100 samples per second of swing).
 * Throws RecordingInputError (PendulumInputError; file, row where one row is at fault, reason) for:
 * columns of unequal length, fewer than two samples, non-finite values, time not strictly
 * increasing, a sampling rate under 20 Hz, no release (the leg never falls), a recording that ends
 * before the leg is at rest.
 *
 * @example
 * // 10 s at 100 Hz: held straight, dropped at 1 s, swinging to rest at 70° (see the unit tests for a full trace).
 * const { indices } = analysePendulumTrace({ timeS, angleDeg }, { fileName: 'left-knee.csv' });
 * indices.relaxationIndex; // A1 / A0, e.g. 1.58 for a relaxed leg
 */
export function analysePendulumTrace(input: PendulumTraceInput, options: PendulumOptions = {}): PendulumAnalysis {
  const file = options.fileName ?? 'trace';
  const lineOf = (i: number): number => (input.lines ? input.lines[Math.min(i, input.lines.length - 1)] : i + 2);
  const lastLine = lineOf(input.timeS.length - 1);
  checkTraceColumns(file, input, lineOf);

  const warnings: string[] = [];
  const grid = uniformGrid(file, input.timeS, lastLine, warnings);
  const fs = grid.rateHz;
  const { stage, gyroFilteredDps, gyroBias } = traceAngle(file, input, grid, options, lastLine, warnings);
  const { angleDeg, velocityDps, release, rest } = stage;
  const releaseIndex = release.index;
  const restAngle = rest.restAngleDeg;
  const startAngle = release.startAngleDeg;
  const peaks = swingPeaks(stage, fs, warnings);

  const a0 = restAngle - startAngle;
  const a1 = peaks.firstPeakDeg - startAngle;
  const r2 = a0 > 0 ? a1 / a0 : Number.NaN;
  if (!(a0 > 0)) warnings.push(`resting angle is not beyond the starting angle (A0 = ${roundTo(a0, 2)}°); R2 is undefined`);
  const velocity = peakFlexionVelocity(stage, peaks.firstPeakIndex, gyroFilteredDps, gyroBias);
  const [flexionArea, extensionArea] = sideAreas(angleDeg, restAngle, releaseIndex, rest.onsetIndex, fs);
  const side = dominantSide(flexionArea, extensionArea);
  const fit = fitSwing({ gridS: grid.gridS, angleDeg, fs, releaseIndex, restOnsetIndex: rest.onsetIndex, restAngleDeg: restAngle, a0Deg: a0, firstPeakAt: peaks.firstPeakAt, firstPeakDeg: peaks.firstPeakDeg }, warnings);

  let emg: PendulumEmgIndices | null = null;
  let envelope: Float64Array | null = null;
  if (input.emgUv) ({ emg, envelope } = emgStage(input.timeS, input.emgUv, grid, { releaseIndex, rest, ...peaks }, options.emgThresholdK ?? 3, warnings));
  const plateauS = (grid.length - rest.onsetIndex) / fs;
  cautionWarnings(warnings, { startAngle, restAngle, r2, peakCount: peaks.peakCount, dominantSide: side, fitTau: fit.converged ? (fit.tauS as number) : Number.NaN, holdS: release.holdS, plateauS });

  return {
    indices: {
      releaseTimeS: grid.startS + releaseIndex / fs,
      startAngleDeg: startAngle,
      restAngleDeg: restAngle,
      firstPeakDeg: peaks.firstPeakDeg,
      firstPeakTimeS: (peaks.firstPeakAt - releaseIndex) / fs,
      a0Deg: a0,
      a1Deg: a1,
      relaxationIndex: r2,
      normalizedRelaxationIndex: r2 / TYPICAL_RELAXATION_INDEX,
      peakCount: peaks.peakCount,
      firstPeriodS: peaks.firstPeriodS,
      peakFlexionVelocityDps: velocity,
      flexionAreaDegS: flexionArea,
      extensionAreaDegS: extensionArea,
      dominantSide: side,
      fit,
      emg,
      sampleRateHz: fs,
      restOnsetS: (rest.onsetIndex - releaseIndex) / fs,
      angleSource: input.angleDeg ? 'angle' : 'gyro',
      warnings,
    },
    signals: {
      startS: grid.startS,
      sampleRateHz: fs,
      angleDeg,
      velocityDps,
      emgEnvelopeUv: envelope,
      releaseIndex,
      firstPeakIndex: peaks.firstPeakAt,
      restOnsetIndex: rest.onsetIndex,
      restEndIndex: rest.endIndex,
      flexionPeakIndices: peaks.flexionPeaks,
      extensionPeakIndices: peaks.extensionPeaks,
    },
  };
}
