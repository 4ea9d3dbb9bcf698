import { roundTo } from '../stats';

/** What the cautions look at. */
export interface CautionInput {
  readonly startAngle: number;
  readonly restAngle: number;
  readonly r2: number;
  readonly peakCount: number;
  readonly dominantSide: string;
  readonly fitTau: number;
  readonly holdS: number;
  readonly plateauS: number;
}

/**
 * Last step of analysePendulumTrace: plain-language cautions about positioning, hold and plateau.
 * R2 alone never stands for "unaffected" when another sign disagrees.
 */
export function cautionWarnings(warnings: string[], c: CautionInput): void {
  if (c.startAngle > 30) warnings.push(`starting angle ${roundTo(c.startAngle, 1)}° is far from full extension; A0, A1 and R2 depend on it`);
  if (c.restAngle < 45 || c.restAngle > 110) {
    warnings.push(`resting angle ${roundTo(c.restAngle, 1)}° is unusual for a freely hanging leg; check positioning, calibration or a contracture`);
  }
  if (c.holdS < 0.1) warnings.push('no steady hold before release; the leg may have been moving when let go');
  if (c.plateauS < 1) warnings.push(`the recording ends ${roundTo(c.plateauS, 2)} s after the leg came to rest; the resting angle rests on a short plateau`);
  if (c.r2 >= 1.3) {
    const others: string[] = [];
    if (c.peakCount <= 2) others.push(`only ${c.peakCount} flexion swing${c.peakCount === 1 ? '' : 's'} passed the resting angle`);
    if (c.dominantSide === 'flexion') others.push('the swing stayed mostly on the flexion side of rest');
    if (c.fitTau < 1) others.push(`the swing died out quickly (fit τ = ${roundTo(c.fitTau, 2)} s)`);
    if (c.restAngle < 45 || c.restAngle > 110) others.push('the resting angle is unusual');
    if (others.length > 0) {
      warnings.push(
        `R2 = ${roundTo(c.r2, 2)} is in or near the relaxed range, but ${others.join('; ')}: do not read this leg as unaffected on R2 alone`,
      );
    }
  }
}
