import { analysePendulumTrace, PendulumInputError, type PendulumAnalysis } from '../../pendulum';
import { MotionInputError } from './motion-input-error';
import type { MotionRecording } from './motion-recording';
import { reconstructKneeAngle, type KneeAngleOptions, type KneeAngleReconstruction } from './reconstruct-knee-angle';

export interface MotionPendulumResult {
  readonly reconstruction: KneeAngleReconstruction;
  /** The pendulum engine's analysis of the reconstructed angle; sensor warnings come first. */
  readonly analysis: PendulumAnalysis;
}

/**
 * Analyses a pendulum test recorded with a phone on the shank: reconstructKneeAngle, then
 * analysePendulumTrace on the reconstructed `time_s, angle_deg` trace (file lines kept for messages).
 * The engine's indices are returned unchanged except that the sensor's warnings (rate, dropped
 * samples, axis, gyro–gravity disagreement) are put before the engine's own.
 * Throws MotionInputError (file, row, reason) for input either stage refuses.
 */
export function analyseMotionRecording(recording: MotionRecording, options: KneeAngleOptions = {}): MotionPendulumResult {
  const file = options.fileName ?? 'recording';
  const reconstruction = reconstructKneeAngle(recording, options);
  let analysis: PendulumAnalysis;
  try {
    analysis = analysePendulumTrace(
      { timeS: reconstruction.timeS, angleDeg: reconstruction.angleDeg, ...(recording.lines ? { lines: recording.lines } : {}) },
      { fileName: file },
    );
  } catch (error) {
    // The trace is the phone's reconstruction, not a file the user wrote: no row to name.
    if (error instanceof PendulumInputError) throw new MotionInputError(file, null, `the knee angle reconstructed from the phone: ${error.reason}`);
    throw error;
  }
  const indices = { ...analysis.indices, warnings: [...reconstruction.warnings, ...analysis.indices.warnings] };
  return { reconstruction, analysis: { indices, signals: analysis.signals } };
}
