import { roundTo } from '../../stats';
import type { MotionColumns } from './motion-columns';
import { movingMean } from './vector3';

/** Smoothing of the rate magnitude for finding the first fall: ±20 ms moving mean. */
const SMOOTH_HALF_WINDOW_MS = 20;
/** A fall reaches hundreds of deg/s; anything slower than this is no pendulum test (common practice). */
const MIN_FALL_RATE_DPS = 60;
/** The first fall is the first stretch above 30 % of the fastest rate (and above MIN_FALL_RATE_DPS). */
const FALL_SHARE = 0.3;
/** The fall starts where the smoothed rate last rose past this: well above a held leg's tremor and sway
 * (≤ 3 deg/s), bias (≤ 2.6 deg/s in magnitude) and smoothed noise. */
const ONSET_RATE_DPS = 15;

/**
 * Step 1 of reconstructKneeAngle: the rotation-rate magnitude, smoothed over ±20 ms, first passes
 * 30 % of its maximum (and 60 deg/s) at `fall`; walking back to where it rose past 15 deg/s gives
 * `onset`. Nothing before that is assumed still sample by sample: a held leg shakes with tremor and sway.
 */
export function firstFall(c: MotionColumns, refuse: (reason: string) => never): { fall: number; onset: number } {
  const { gx, gy, gz } = c;
  const smooth = movingMean(c.timeMs, (i) => Math.hypot(gx[i], gy[i], gz[i]), SMOOTH_HALF_WINDOW_MS);
  let fastest = 0;
  for (let i = 0; i < c.n; i++) if (smooth[i] > fastest) fastest = smooth[i];
  if (fastest < MIN_FALL_RATE_DPS) {
    refuse(`no fall found: the phone never turned faster than ${roundTo(fastest, 0)} deg/s (a released leg reaches hundreds); was the phone strapped to the shank and the leg let go?`);
  }
  const fallThreshold = Math.max(MIN_FALL_RATE_DPS, FALL_SHARE * fastest);
  let fall = 0;
  while (smooth[fall] <= fallThreshold) fall++;
  let onset = fall;
  while (onset > 0 && smooth[onset - 1] > ONSET_RATE_DPS) onset--;
  return { fall, onset };
}
