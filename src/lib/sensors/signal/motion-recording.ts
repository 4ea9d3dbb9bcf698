/**
 * A device-motion recording as typed columns, one entry per `devicemotion` event, in the units and
 * on the axes of the W3C Device Orientation and Motion specification:
 *
 * - Device axes: x to the right of the screen, y up along the screen (towards the top edge), z out of
 *   the screen towards the viewer; right-handed.
 * - `rotationRate` in degrees per second: **alpha about x, beta about y, gamma about z** (right-hand
 *   rule: positive counter-clockwise seen from the axis tip). So the angular-velocity vector on
 *   (x, y, z) is (alpha, beta, gamma) — see deviceAngularVelocity. The current W3C text (Device
 *   Orientation and Motion, the DeviceMotionEventRotationRate section after w3c/deviceorientation
 *   PR #43 for issue #44) says: "alpha: The rate of rotation around the X axis", "beta: … around the
 *   Y axis", "gamma: … around the Z axis" (quoted from memory of the spec text; the change was made
 *   because Chrome and Firefox on Android and Safari on iOS all deliver it that way). The older text
 *   paired alpha with z, beta with x and gamma with y; Kinnote read it that way before this was
 *   corrected (issue 13; saved recordings were analysed again by the schema-7 step, see RATE_AXES_NOTE).
 *   The raw samples were always stored under the browser's names, so only the reading changed.
 *   reconstructKneeAngle detects files written in that older order from the data and says so.
 * - `accelerationIncludingGravity` in m/s²: what an accelerometer measures, the device's acceleration
 *   minus gravity ("g-force"): a phone lying still, screen up, reads (0, 0, +9.81).
 * - Time stamps in milliseconds (Event.timeStamp, or whatever clock the file used), strictly increasing.
 */
export interface MotionRecording {
  readonly timeMs: Float64Array;
  readonly rateAlphaDps: Float64Array;
  readonly rateBetaDps: Float64Array;
  readonly rateGammaDps: Float64Array;
  readonly accXMs2: Float64Array;
  readonly accYMs2: Float64Array;
  readonly accZMs2: Float64Array;
  /** 1-based file line of each sample, for messages; absent for live recordings (index + 2 is used). */
  readonly lines?: Int32Array;
}

/** The CSV header of a motion recording, in column order. */
export const MOTION_CSV_COLUMNS = [
  'time_ms',
  'rate_alpha_dps',
  'rate_beta_dps',
  'rate_gamma_dps',
  'acc_x_ms2',
  'acc_y_ms2',
  'acc_z_ms2',
] as const;

/** Standard gravity, 9.80665 m/s² (CGPM 1901, the conventional value). */
export const STANDARD_GRAVITY_MS2 = 9.80665;

/** One sentence for documents and messages: how the rotation-rate columns map to the device axes. */
export const RATE_AXES_NOTE =
  'rate_alpha_dps is the rotation rate about the device x axis, rate_beta_dps about y, rate_gamma_dps about z (current W3C Device Orientation and Motion text, as Chrome and Firefox on Android and Safari on iOS deliver it)';

/**
 * Writes sample i's angular velocity on the device axes (x, y, z) in deg/s into `out`:
 * (alpha, beta, gamma), because the current W3C rotationRate text names the rate around the X axis
 * "alpha", around Y "beta" and around Z "gamma" (see the MotionRecording comment). Returns `out`.
 */
export function deviceAngularVelocity(recording: MotionRecording, i: number, out: Float64Array): Float64Array {
  out[0] = recording.rateAlphaDps[i];
  out[1] = recording.rateBetaDps[i];
  out[2] = recording.rateGammaDps[i];
  return out;
}

/** Number of samples; throws RangeError when the columns differ in length. */
export function motionSampleCount(recording: MotionRecording): number {
  const n = recording.timeMs.length;
  for (const column of [recording.rateAlphaDps, recording.rateBetaDps, recording.rateGammaDps, recording.accXMs2, recording.accYMs2, recording.accZMs2]) {
    if (column.length !== n) throw new RangeError(`motion recording columns differ in length (${column.length} against ${n} time stamps)`);
  }
  return n;
}
