import { roundTo } from '../../stats';
import type { HoldAndRest } from './hold-and-rest';
import type { MotionColumns } from './motion-columns';
import { flexionFromGravity, integrateRate, mean, movingMean, wrap180 } from './vector3';

/** Gyro and gravity must agree on start-to-rest within this (deg); a bias error of 0.5 deg/s over 10 s is 5°. */
const MAX_DISAGREEMENT_DEG = 8;
/** Before the hold the angle is gravity's, smoothed over ±100 ms (the hand's tremor and sensor noise). */
const PRE_HOLD_SMOOTH_HALF_WINDOW_MS = 100;

/** The knee's geometry on the device axes: knee axis k, shank line s, and gravity's start angle. */
export interface KneeGeometry {
  readonly k: Float64Array;
  readonly shank: Float64Array;
  readonly gravityStart: number;
}

export interface FusedKneeAngle {
  readonly angleDeg: Float64Array;
  readonly gyroAngleDeg: Float64Array;
  readonly startAngleDeg: number;
  readonly gyroExcursionDeg: number;
  readonly gravityExcursionDeg: number;
  /** Gyro minus gravity start-to-rest excursion (deg), removed as a linear drift. */
  readonly disagreement: number;
}

/**
 * Step 6 of reconstructKneeAngle: the start from gravity (or the caller's), then the gyro about the
 * axis (trapezoidal integration, Neumaier-compensated); the gap between the gyro's and gravity's
 * start-to-rest excursions is removed as a linear bias drift between the hold's and the rest's
 * centres (exact for a constant bias error). Refuses a gap over MAX_DISAGREEMENT_DEG.
 */
export function fusedKneeAngle(c: MotionColumns, hr: HoldAndRest, geometry: KneeGeometry, startAngleOption: number | undefined, refuse: (reason: string) => never): FusedKneeAngle {
  const { n, timeMs, gx, gy, gz } = c;
  const { k } = geometry;
  const { bias, holdStart, holdEnd, restStart, restEnd } = hr;
  const rate = new Float64Array(n);
  for (let i = 0; i < n; i++) rate[i] = k[0] * (gx[i] - bias[0]) + k[1] * (gy[i] - bias[1]) + k[2] * (gz[i] - bias[2]);
  const psi = new Float64Array(n);
  integrateRate(timeMs, rate, psi);
  const psiHold = mean(psi, holdStart, holdEnd);
  const gyroExcursionDeg = mean(psi, restStart, restEnd) - psiHold;
  const gravityExcursionDeg = wrap180(flexionFromGravity(hr.gRest, k, geometry.shank) - geometry.gravityStart);
  const disagreement = gyroExcursionDeg - gravityExcursionDeg;
  if (Math.abs(disagreement) > MAX_DISAGREEMENT_DEG) {
    refuse(
      `the phone's gyroscope and its gravity reading disagree by ${roundTo(Math.abs(disagreement), 0)}° between the held start and the rest: the phone may have slipped on its strap or the leg moved other than about the knee`,
    );
  }
  const startAngleDeg = startAngleOption ?? geometry.gravityStart;
  const tHold = 0.5 * (timeMs[holdStart] + timeMs[holdEnd - 1]);
  const tRest = 0.5 * (timeMs[restStart] + timeMs[restEnd - 1]);
  const angleDeg = new Float64Array(n);
  const gyroAngleDeg = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const ramp = Math.min(1, Math.max(0, (timeMs[i] - tHold) / (tRest - tHold)));
    gyroAngleDeg[i] = startAngleDeg + psi[i] - psiHold;
    angleDeg[i] = gyroAngleDeg[i] - ramp * disagreement;
  }
  gravityAngleBeforeHold(c, holdStart, geometry, startAngleDeg, angleDeg);
  return { angleDeg, gyroAngleDeg, startAngleDeg, gyroExcursionDeg, gravityExcursionDeg, disagreement };
}

/**
 * Before the judged hold the gyro is not anchored: integrated back through minutes of a held leg, the
 * bias left after the rest's estimate (its noise) walks the angle anywhere (issue 20). There the angle
 * is gravity's reading, smoothed, on the same knee axis and shank line: bounded, and as good as the
 * start's own anchor. The test itself starts at the hold. Writes angleDeg[0..holdStart).
 */
function gravityAngleBeforeHold(c: MotionColumns, holdStart: number, geometry: KneeGeometry, startAngleDeg: number, angleDeg: Float64Array): void {
  if (holdStart <= 0) return;
  const { ax, ay, az } = c;
  const before = c.timeMs.subarray(0, holdStart);
  const gxMean = movingMean(before, (i) => ax[i], PRE_HOLD_SMOOTH_HALF_WINDOW_MS);
  const gyMean = movingMean(before, (i) => ay[i], PRE_HOLD_SMOOTH_HALF_WINDOW_MS);
  const gzMean = movingMean(before, (i) => az[i], PRE_HOLD_SMOOTH_HALF_WINDOW_MS);
  const g = new Float64Array(3);
  for (let i = 0; i < holdStart; i++) {
    g[0] = gxMean[i];
    g[1] = gyMean[i];
    g[2] = gzMean[i];
    angleDeg[i] = startAngleDeg + wrap180(flexionFromGravity(g, geometry.k, geometry.shank) - geometry.gravityStart);
  }
}
