import { roundTo } from '../../stats';
import type { MotionColumns } from './motion-columns';
import { STANDARD_GRAVITY_MS2 } from './motion-recording';
import { blockSpread, meanVector, norm } from './vector3';

/** The hold is judged over up to 1 s ending 0.1 s before the onset, and needs at least 0.3 s. */
const HOLD_GAP_MS = 100;
const HOLD_MAX_MS = 1000;
const HOLD_MIN_MS = 300;
/** Averaging block for judging a hold or a rest on means rather than single samples. */
const HOLD_BLOCK_MS = 100;
const REST_BLOCK_MS = 250;
/** A hold: every 0.1 s mean of the rotation rate within 8 deg/s of the hold's mean (hand sway reaches ~3). */
const HOLD_RATE_SPREAD_DPS = 8;
/** A rest: every 0.25 s mean within 4 deg/s of the rest's mean (a 0.5° wobble at 1 Hz reaches ~3). */
const REST_RATE_SPREAD_DPS = 4;
/** The final rest is the last 1.5 s (at least 1 s of samples). */
const REST_MS = 1500;
const REST_MIN_MS = 1000;
/** Mean acceleration of a hold or rest within this of g (m/s²): otherwise the phone was being carried. */
const GRAVITY_TOLERANCE_MS2 = 0.6;

/** The judged hold and final rest: sample ranges [start, end), gravity in each, the gyro bias. */
export interface HoldAndRest {
  readonly holdStart: number;
  readonly holdEnd: number;
  readonly restStart: number;
  readonly restEnd: number;
  /** Mean acceleration over the hold and the rest (gravity, m/s², device axes). */
  readonly gHold: Float64Array;
  readonly gRest: Float64Array;
  /** Mean rotation rate over the rest (the gyro bias) and over the hold (deg/s, device axes). */
  readonly bias: Float64Array;
  readonly holdRate: Float64Array;
}

/**
 * Steps 2 and 3 of reconstructKneeAngle. The hold is the window up to 1 s ending 0.1 s before the
 * onset, judged on 0.1 s means (rotation within 8 deg/s of its mean, mean acceleration ≈ g); its mean
 * acceleration is gravity at the start. The final rest is the last 1.5 s, judged on 0.25 s means; its
 * mean rotation rate is the gyro bias (a hanging leg is truly still; the hold's mean carries the
 * hand's sway), and its mean acceleration is gravity at rest.
 */
export function holdAndRest(c: MotionColumns, onset: number, refuse: (reason: string) => never): HoldAndRest {
  const { n, timeMs, gx, gy, gz, ax, ay, az } = c;
  const holdEndMs = timeMs[onset] - HOLD_GAP_MS;
  let holdEnd = onset;
  while (holdEnd > 0 && timeMs[holdEnd - 1] > holdEndMs) holdEnd--;
  let holdStart = holdEnd;
  while (holdStart > 0 && timeMs[holdStart - 1] >= holdEndMs - HOLD_MAX_MS) holdStart--;
  if (holdEnd - holdStart < 5 || timeMs[holdEnd - 1] - timeMs[holdStart] < HOLD_MIN_MS) {
    refuse(`the recording starts ${roundTo((timeMs[onset] - timeMs[0]) / 1000, 2)} s before the leg starts to fall; start recording while the leg is held, then let go after a second`);
  }
  const holdRateSpread = blockSpread(timeMs, gx, gy, gz, holdStart, holdEnd, HOLD_BLOCK_MS);
  if (holdRateSpread > HOLD_RATE_SPREAD_DPS) {
    refuse(`the leg was moving before it was let go: in the second before the fall the phone's turning rate varied by ${roundTo(holdRateSpread, 0)} deg/s on average; hold the leg steady, then let go`);
  }
  const gHold = meanVector(ax, ay, az, holdStart, holdEnd);
  const gHoldNorm = norm(gHold);
  if (Math.abs(gHoldNorm - STANDARD_GRAVITY_MS2) > GRAVITY_TOLERANCE_MS2) {
    refuse(`the phone measured ${roundTo(gHoldNorm, 2)} m/s² before the fall instead of gravity's ${roundTo(STANDARD_GRAVITY_MS2, 2)}: it was being moved or its accelerometer is off`);
  }

  let restStart = n;
  while (restStart > 0 && timeMs[restStart - 1] >= timeMs[n - 1] - REST_MS) restStart--;
  const restEnd = n;
  if (restStart <= onset || timeMs[n - 1] - timeMs[restStart] < REST_MIN_MS || restEnd - restStart < 10) {
    refuse('the recording ends before the leg came to rest: keep recording until the leg has hung still for two seconds');
  }
  const restRateSpread = blockSpread(timeMs, gx, gy, gz, restStart, restEnd, REST_BLOCK_MS);
  const gRest = meanVector(ax, ay, az, restStart, restEnd);
  if (restRateSpread > REST_RATE_SPREAD_DPS || Math.abs(norm(gRest) - STANDARD_GRAVITY_MS2) > GRAVITY_TOLERANCE_MS2) {
    refuse('the recording ends before the leg came to rest (the phone was still turning in its last 1.5 s): keep recording until the leg has hung still for two seconds');
  }
  const bias = meanVector(gx, gy, gz, restStart, restEnd);
  const holdRate = meanVector(gx, gy, gz, holdStart, holdEnd);
  return { holdStart, holdEnd, restStart, restEnd, gHold, gRest, bias, holdRate };
}
