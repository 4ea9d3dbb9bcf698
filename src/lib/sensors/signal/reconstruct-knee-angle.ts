import { RecordingInputError } from '../../domain';
import { roundTo } from '../../stats';
import { firstFall } from './first-fall';
import { fusedKneeAngle } from './fused-knee-angle';
import { holdAndRest } from './hold-and-rest';
import { kneeAxis } from './knee-axis';
import { motionColumns, type MotionColumns } from './motion-columns';
import type { MotionRecording } from './motion-recording';
import type { MotionTiming } from './motion-timing';
import type { RateAxisOrder } from './rate-axis-order';
import { shankLine } from './shank-line';
import { dot } from './vector3';

export interface KneeAngleOptions {
  /** Name used in refusal messages. */
  readonly fileName?: string;
  /**
   * Knee flexion at the held start (deg), when the examiner knows it better than the phone (e.g. from a
   * goniometer). Default: the phone's own reading of the shank against gravity.
   */
  readonly startAngleDeg?: number;
}

/** The reconstructed knee angle and what was learnt about the sensor on the way. */
export interface KneeAngleReconstruction {
  /** Time stamps in seconds, in the recording's own time base (time_ms / 1000). */
  readonly timeS: Float64Array;
  /** Knee flexion (deg, 0 = straight with a level thigh), increasing as the knee bends. */
  readonly angleDeg: Float64Array;
  /** Gyro-only angle (rest bias removed, no gravity correction), from the same start, for comparison. */
  readonly gyroAngleDeg: Float64Array;
  /** Knee rotation axis on the device axes (x, y, z), oriented so that flexion is positive. */
  readonly axis: Float64Array;
  /** Share of the gyro's second moment about that axis (1 = a pure hinge). */
  readonly axisShare: number;
  /** Gyro rate about the axis (deg/s) averaged over the held start, and over the final rest (the bias used). */
  readonly biasStartDps: number;
  readonly biasEndDps: number;
  /** Held start and final rest as [start, end) sample ranges. */
  readonly hold: readonly [number, number];
  readonly rest: readonly [number, number];
  /** Sample where the first fall starts (the rotation rate first rises past ONSET_RATE_DPS). */
  readonly fallOnset: number;
  /** Knee flexion at the held start, from gravity along the shank (or the caller's startAngleDeg). */
  readonly startAngleDeg: number;
  /** Which device axis was taken as the shank's line ('+y' = the phone's top edge points to the ankle). */
  readonly shankAxis: '+x' | '-x' | '+y' | '-y';
  /**
   * Bound (deg) on absolute angles (start, rest, peaks) from the phone's tilt on the shank within the
   * swing plane, which no reading reveals: MOUNTING_TILT_BOUND_DEG. A0, A1 and R2 are differences and
   * do not carry it.
   */
  readonly absoluteAngleBoundDeg: number;
  /** Angle between the knee axis and the horizontal during the hold (deg); 0 for a level thigh. */
  readonly axisTiltDeg: number;
  /** Rest minus start: by gravity alone and by the gyro alone (deg); their gap says how well they agree. */
  readonly gravityExcursionDeg: number;
  readonly gyroExcursionDeg: number;
  /** The rotation-rate column order used ('current' W3C text unless the data showed the older one). */
  readonly rateOrder: RateAxisOrder;
  readonly timing: MotionTiming;
  /** Plain-language notes on the recording (low rate, dropped samples, older column order, …). */
  readonly warnings: string[];
}

/** The first fall must bend the knee by at least this (deg); even a severe catch lets it drop more. */
const MIN_FIRST_FALL_DEG = 10;
/** A hanging leg rests in this range (deg of flexion). */
const REST_RANGE_DEG: readonly [number, number] = [20, 130];
/**
 * How far the phone's long edge may lie off the shank's line within the swing plane (deg): the
 * placement instruction ("along the shin bone") allows 15°; the tibia's front surface itself is a few
 * degrees off the knee–ankle line (from memory). Project choice; no reading can measure it.
 */
export const MOUNTING_TILT_BOUND_DEG = 15;

/**
 * Reconstructs the knee flexion angle of a seated pendulum test from a phone strapped to the shank,
 * recorded with a hand-held start.
 *
 * Method (this project's design; the ingredients are standard inertial-sensing practice), one file a
 * step (motion-columns, first-fall, hold-and-rest, knee-axis, shank-line, fused-knee-angle):
 * 1. First fall first: the rotation-rate magnitude, smoothed over ±20 ms, first passes 30 % of its
 *    maximum (and 60 deg/s) in the fall; walking back to where it rose past 15 deg/s gives the onset.
 *    Nothing before that is assumed still sample by sample: a held leg shakes with tremor and sway.
 * 2. The hold is the window up to 1 s ending 0.1 s before the onset, judged on 0.1 s means (rotation
 *    within 8 deg/s of its mean, mean acceleration ≈ g); its mean acceleration is gravity at the start.
 * 3. The final rest is the last 1.5 s, judged on 0.25 s means; its mean rotation rate is the gyro bias
 *    (a hanging leg is truly still; the hold's mean carries the hand's sway), and its mean acceleration
 *    is gravity at rest.
 * 4. Knee axis: the dominant eigenvector of Σ ωωᵀ over the bias-free swing samples (principalAxis),
 *    oriented so that the first fall turns positively: the first fast motion is flexion.
 * 5. Shank line: the device x or y axis (the phone lies along the shin, upright, upside down or
 *    sideways), projected on the swing plane; of the four signed candidates, the one that puts the held
 *    start nearest 15° of flexion (candidates are 90° apart, starts lie within 5–25°).
 *    Flexion = atan2(d·s, d·(k × s)) with d the downward direction in the swing plane: 0° with the
 *    shank level, 90° hanging (a level thigh is assumed, as the test prescribes).
 * 6. Angle: the start from gravity, then the gyro about the axis (trapezoidal integration); the gap
 *    between the gyro's and gravity's start-to-rest excursions is removed as a linear bias drift
 *    between the hold's and the rest's centres (exact for a constant bias error). Before the judged
 *    hold (a recording may run minutes before the release) the angle is gravity's, smoothed: the gyro
 *    integrated back over minutes would carry its bias error into the trace.
 * 7. Shape checks, each a refusal that names the recording and the phone: a fall, a steady hold, a
 *    hinge, a level knee axis, gyro and gravity agreeing, a start near extension, a fall into flexion,
 *    a plausible rest.
 *
 * Cost: O(n), a few passes. Throws RecordingInputError (alias MotionInputError: file, row, reason) for
 * malformed columns (row named where one row is at fault) and, with no row, for every failed shape check.
 *
 * @example
 * const recording = parseMotionCsv(text, 'left-knee-phone.csv');
 * const { angleDeg, startAngleDeg, warnings } = reconstructKneeAngle(recording, { fileName: 'left-knee-phone.csv' });
 * // angleDeg: knee flexion per sample, e.g. from about 15° at the hold to about 80° at rest
 */
export function reconstructKneeAngle(recording: MotionRecording, options: KneeAngleOptions = {}): KneeAngleReconstruction {
  const file = options.fileName ?? 'recording';
  const refuse = (reason: string): never => {
    throw new RecordingInputError(file, null, reason);
  };
  const warnings: string[] = [];
  const columns = motionColumns(file, recording, warnings);
  const fall = firstFall(columns, refuse);
  const hr = holdAndRest(columns, fall.onset, refuse);
  const { k, share, axisTiltDeg } = kneeAxis(columns, fall, hr, refuse, warnings);
  const { shankAxis, shank, gravityStart } = shankLine(hr.gHold, k, refuse);
  const fused = fusedKneeAngle(columns, hr, { k, shank, gravityStart }, options.startAngleDeg, refuse);
  checkShape(columns, fall.onset, fused.angleDeg, fused.startAngleDeg, fused.gravityExcursionDeg, refuse);
  if (Math.abs(fused.disagreement) > 5) {
    warnings.push(`gyro and gravity disagree by ${roundTo(Math.abs(fused.disagreement), 1)}° between start and rest; gravity was used to correct the angle`);
  }
  const timeS = new Float64Array(columns.n);
  for (let i = 0; i < columns.n; i++) timeS[i] = columns.timeMs[i] / 1000;
  return {
    timeS,
    angleDeg: fused.angleDeg,
    gyroAngleDeg: fused.gyroAngleDeg,
    axis: Float64Array.from(k),
    axisShare: share,
    biasStartDps: dot(k, hr.holdRate),
    biasEndDps: dot(k, hr.bias),
    hold: [hr.holdStart, hr.holdEnd],
    rest: [hr.restStart, hr.restEnd],
    fallOnset: fall.onset,
    startAngleDeg: fused.startAngleDeg,
    shankAxis,
    absoluteAngleBoundDeg: MOUNTING_TILT_BOUND_DEG,
    axisTiltDeg,
    gravityExcursionDeg: fused.gravityExcursionDeg,
    gyroExcursionDeg: fused.gyroExcursionDeg,
    rateOrder: columns.rateOrder,
    timing: columns.timing,
    warnings,
  };
}

/** Step 7: the shape of a pendulum test: a fall into flexion within 1.5 s of the onset, a plausible rest. */
function checkShape(c: MotionColumns, onset: number, angleDeg: Float64Array, startAngleDeg: number, gravityExcursionDeg: number, refuse: (reason: string) => never): void {
  const { n, timeMs } = c;
  let deepest = -Infinity;
  for (let i = onset; i < n && timeMs[i] <= timeMs[onset] + 1500; i++) deepest = Math.max(deepest, angleDeg[i]);
  if (deepest - startAngleDeg < MIN_FIRST_FALL_DEG) {
    refuse(`the leg did not fall into flexion: the first fast motion bent the knee by only ${roundTo(deepest - startAngleDeg, 0)}°`);
  }
  const restAngle = startAngleDeg + gravityExcursionDeg;
  if (restAngle < REST_RANGE_DEG[0] || restAngle > REST_RANGE_DEG[1] || restAngle <= startAngleDeg + MIN_FIRST_FALL_DEG) {
    refuse(`the leg came to rest at ${roundTo(restAngle, 0)}° of flexion, which a freely hanging leg does not (expected ${REST_RANGE_DEG[0]}° to ${REST_RANGE_DEG[1]}°, beyond the start)`);
  }
}
