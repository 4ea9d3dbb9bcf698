import type { AngleStage } from './angle-stage';

/**
 * Step 5 of analysePendulumTrace: the peak flexion velocity of the first downswing (deg/s), from
 * release to the first flexion peak. The gyro, when given, measures it directly (less its bias for
 * gyro-only input, where the angle itself came from the gyro); else the angle's central difference.
 */
export function peakFlexionVelocity(stage: AngleStage, firstPeakIndex: number, gyroFilteredDps: Float64Array | null, gyroBias: ((i: number) => number) | null): number {
  const i0 = Math.min(Math.ceil(stage.release.index), stage.angleDeg.length - 1);
  let peak = -Infinity;
  for (let i = i0; i <= firstPeakIndex; i++) {
    const v = gyroFilteredDps ? gyroFilteredDps[i] - (gyroBias ? gyroBias(i) : 0) : stage.velocityDps[i];
    if (v > peak) peak = v;
  }
  return peak;
}
