import { roundTo } from '../../stats';
import { flexionFromGravity, norm } from './vector3';

/** Where a pendulum test starts: candidates for the shank's line are judged by their distance from 15°. */
const EXPECTED_START_DEG = 15;
const START_RANGE_DEG: readonly [number, number] = [-25, 60];

export type ShankAxis = '+x' | '-x' | '+y' | '-y';

/**
 * Step 5 of reconstructKneeAngle: the shank's line is the device x or y axis (the phone lies along
 * the shin, upright, upside down or sideways), projected on the swing plane; of the four signed
 * candidates, the one that puts the held start nearest 15° of flexion (candidates are 90° apart,
 * starts lie within 5–25°). Flexion = atan2(d·s, d·(k × s)) with d the downward direction in the
 * swing plane: 0° with the shank level, 90° hanging (a level thigh is assumed, as the test prescribes).
 * Refuses a start outside −25°..60°.
 */
export function shankLine(gHold: Float64Array, k: Float64Array, refuse: (reason: string) => never): { shankAxis: ShankAxis; shank: Float64Array; gravityStart: number } {
  const candidates: Array<[ShankAxis, number[]]> = [
    ['+x', [1, 0, 0]],
    ['-x', [-1, 0, 0]],
    ['+y', [0, 1, 0]],
    ['-y', [0, -1, 0]],
  ];
  let shankAxis: ShankAxis = '+y';
  let shank = new Float64Array(3);
  let bestStart = Number.NaN;
  for (const [name, e] of candidates) {
    const along = e[0] * k[0] + e[1] * k[1] + e[2] * k[2];
    const s = Float64Array.of(e[0] - along * k[0], e[1] - along * k[1], e[2] - along * k[2]);
    const length = norm(s);
    if (length < 0.5) continue;
    for (let c = 0; c < 3; c++) s[c] /= length;
    const start = flexionFromGravity(gHold, k, s);
    if (Number.isNaN(bestStart) || Math.abs(start - EXPECTED_START_DEG) < Math.abs(bestStart - EXPECTED_START_DEG)) {
      bestStart = start;
      shank = s;
      shankAxis = name;
    }
  }
  if (!(bestStart >= START_RANGE_DEG[0] && bestStart <= START_RANGE_DEG[1])) {
    refuse(
      `the phone's long edge does not seem to lie along the shank, or the leg was not held near straight (the start reads ${roundTo(bestStart, 0)}° of flexion, expected ${START_RANGE_DEG[0]}° to ${START_RANGE_DEG[1]}°)`,
    );
  }
  return { shankAxis, shank, gravityStart: bestStart };
}
