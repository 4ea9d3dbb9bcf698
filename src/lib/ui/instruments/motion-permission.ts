import { requestMotionPermission, type MotionProblem } from '$lib/sensors';

/** Page state that shows why motion access failed (the inclinometer and the phone swing recorder). */
export interface MotionProblemHolder {
  problem: MotionProblem | null;
  problemDetail: string;
}

/**
 * Asks for motion access; call it first thing in the tap, before any other await (Safari grants
 * access only during a user gesture). Sets the holder's problem when refused, clears it when granted.
 * Returns whether access was granted.
 */
export async function startMotionInTap(holder: MotionProblemHolder): Promise<boolean> {
  const permission = await requestMotionPermission();
  if (!permission.ok) {
    holder.problem = permission.problem;
    holder.problemDetail = permission.detail;
    return false;
  }
  holder.problem = null;
  holder.problemDetail = '';
  return true;
}
