/**
 * A device-motion recording as typed columns, one entry per `devicemotion` event, in the units and
 * on the axes of the W3C Device Orientation and Motion specification:
 *
 * - Device axes: x to the right of the screen, y up along the screen (towards the top edge), z out of
 *   the screen towards the viewer; right-handed.
 * - `rotationRate` in degrees per second: alpha about z, beta about x, gamma about y (right-hand rule:
 *   positive counter-clockwise seen from the axis tip). So the angular-velocity vector on (x, y, z) is
 *   (beta, gamma, alpha) — see deviceAngularVelocity.
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

/**
 * Writes sample i's angular velocity on the device axes (x, y, z) in deg/s into `out`:
 * (beta, gamma, alpha), because the W3C rotationRate names rotation about x "beta", about y
 * "gamma" and about z "alpha". Returns `out`.
 */
export function deviceAngularVelocity(recording: MotionRecording, i: number, out: Float64Array): Float64Array {
  out[0] = recording.rateBetaDps[i];
  out[1] = recording.rateGammaDps[i];
  out[2] = recording.rateAlphaDps[i];
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
