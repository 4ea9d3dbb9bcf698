import { roundTo } from '../../stats';
import type { HoldAndRest } from './hold-and-rest';
import type { MotionColumns } from './motion-columns';
import { principalAxis } from './principal-axis';
import { dot, norm } from './vector3';

/** Samples faster than this (bias removed) count as swing for the axis estimate. */
const MOTION_RATE_DPS = 20;
/** Knee-axis share under which the rotation is no hinge: refused; under the second, a warning. */
const MIN_AXIS_SHARE = 0.8;
const WARN_AXIS_SHARE = 0.95;
/** Knee axis farther than this from level: gravity cannot give the shank's angle. */
const MAX_AXIS_TILT_DEG = 30;

/**
 * Step 4 of reconstructKneeAngle: the knee axis is the dominant eigenvector of Σ ωωᵀ over the
 * bias-free swing samples (principalAxis), oriented so that the first fall turns positively (the
 * first fast motion is flexion). Refuses no swing, no hinge, or an axis too far from level.
 */
export function kneeAxis(c: MotionColumns, fall: { fall: number; onset: number }, hr: HoldAndRest, refuse: (reason: string) => never, warnings: string[]): { k: Float64Array; share: number; axisTiltDeg: number } {
  const { gx, gy, gz } = c;
  const { bias } = hr;
  const moment = new Float64Array(9);
  const seed = new Float64Array(3);
  const w = new Float64Array(3);
  let largest = 0;
  let motionCount = 0;
  for (let i = fall.onset; i < hr.restStart; i++) {
    w[0] = gx[i] - bias[0];
    w[1] = gy[i] - bias[1];
    w[2] = gz[i] - bias[2];
    const magnitude = norm(w);
    if (magnitude < MOTION_RATE_DPS) continue;
    motionCount++;
    if (magnitude > largest) {
      largest = magnitude;
      seed.set(w);
    }
    for (let r = 0; r < 3; r++) for (let col = 0; col < 3; col++) moment[3 * r + col] += w[r] * w[col];
  }
  if (motionCount < 3) refuse(`no swing found: the phone turned faster than ${MOTION_RATE_DPS} deg/s on fewer than three samples`);
  const principal = principalAxis(moment, seed);
  const k = principal.axis;
  if (principal.share < MIN_AXIS_SHARE) {
    refuse(`the phone did not turn about one axis (only ${roundTo(100 * principal.share, 0)} % of the rotation was about the knee's): the strap may have slipped or the leg twisted`);
  }
  if (principal.share < WARN_AXIS_SHARE) {
    warnings.push(`only ${roundTo(100 * principal.share, 0)} % of the rotation was about one axis; the leg may have twisted or the phone moved on its strap`);
  }
  let fallSum = 0;
  for (let i = fall.onset; i <= fall.fall; i++) fallSum += k[0] * (gx[i] - bias[0]) + k[1] * (gy[i] - bias[1]) + k[2] * (gz[i] - bias[2]);
  if (fallSum < 0) for (let j = 0; j < 3; j++) k[j] = -k[j];
  const axisTiltDeg = Math.asin(Math.min(1, Math.abs(dot(k, hr.gHold)) / norm(hr.gHold))) / (Math.PI / 180);
  if (axisTiltDeg > MAX_AXIS_TILT_DEG) {
    refuse(`the knee axis was ${roundTo(axisTiltDeg, 0)}° from level, so gravity cannot give the shank's angle: seat the person with the thigh level`);
  }
  return { k, share: principal.share, axisTiltDeg };
}
