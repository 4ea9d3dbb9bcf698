import { analysePendulumTrace, PendulumInputError, type PendulumAnalysis } from '../../pendulum';
import { MotionInputError } from './motion-input-error';
import type { MotionRecording } from './motion-recording';
import { reconstructKneeAngle, type KneeAngleOptions, type KneeAngleReconstruction } from './reconstruct-knee-angle';

/** A lead-in longer than this before the hold is mentioned (project choice: a few seconds is the usual start). */
const LONG_LEAD_S = 10;

export interface MotionPendulumResult {
  readonly reconstruction: KneeAngleReconstruction;
  /** The pendulum engine's analysis of the reconstructed angle; sensor warnings come first. */
  readonly analysis: PendulumAnalysis;
}

/**
 * Analyses a pendulum test recorded with a phone on the shank: reconstructKneeAngle, then
 * analysePendulumTrace on the reconstructed `time_s, angle_deg` trace from the judged hold on (file
 * lines kept for messages; a long lead-in before the hold is left out and mentioned in a warning).
 * The engine's indices are returned unchanged except that the sensor's warnings (rate, dropped
 * samples, axis, gyro–gravity disagreement) are put before the engine's own.
 * Throws MotionInputError (file, row, reason) for input either stage refuses.
 *
 * @example
 * const { analysis, reconstruction } = analyseMotionRecording(parseMotionCsv(text, 'phone.csv'), { fileName: 'phone.csv' });
 * analysis.indices.relaxationIndex; // R2 of the swing, with the phone's warnings first in analysis.indices.warnings
 */
export function analyseMotionRecording(recording: MotionRecording, options: KneeAngleOptions = {}): MotionPendulumResult {
  const file = options.fileName ?? 'recording';
  const reconstruction = reconstructKneeAngle(recording, options);
  // The test starts at the judged hold: what comes before it (a recording may run minutes before the
  // release) is not part of it, and the engine's own still-period and release search must not wander
  // there (issue 20). The reconstruction keeps every sample for display and saving.
  const from = reconstruction.hold[0];
  const preHoldS = reconstruction.timeS[from] - reconstruction.timeS[0];
  let analysis: PendulumAnalysis;
  try {
    analysis = analysePendulumTrace(
      {
        timeS: reconstruction.timeS.subarray(from),
        angleDeg: reconstruction.angleDeg.subarray(from),
        ...(recording.lines ? { lines: recording.lines.subarray(from) } : {}),
      },
      { fileName: file },
    );
  } catch (error) {
    // The trace is the phone's reconstruction, not a file the user wrote: no row to name.
    if (error instanceof PendulumInputError) throw new MotionInputError(file, null, `the knee angle reconstructed from the phone: ${error.reason}`);
    throw error;
  }
  const lead = preHoldS > LONG_LEAD_S ? [`the recording ran ${Math.round(preHoldS)} s before the held second that starts the test; that time is not analysed`] : [];
  const indices = { ...analysis.indices, warnings: [...reconstruction.warnings, ...lead, ...analysis.indices.warnings] };
  return { reconstruction, analysis: { indices, signals: analysis.signals } };
}
