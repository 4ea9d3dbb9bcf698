import { ANGLE_LIMITS_DEG, RecordingInputError } from '../domain';
import { roundTo } from '../stats';
import type { PendulumTraceInput } from './pendulum-trace-input';

/**
 * Step 1 of analysePendulumTrace: refuses columns the engine cannot read. Throws RecordingInputError
 * (file; row where one row is at fault; reason) for no angle and no gyro column, fewer than two
 * samples, columns of unequal length, a non-finite value, time not strictly increasing, or an angle
 * outside ANGLE_LIMITS_DEG. `lineOf` maps a sample index to its file line.
 */
export function checkTraceColumns(file: string, input: PendulumTraceInput, lineOf: (i: number) => number): void {
  const { timeS } = input;
  const angle = input.angleDeg ?? null;
  if (!angle && !input.gyroDps) throw new RecordingInputError(file, null, 'no angle and no gyro column');
  const n = timeS.length;
  if (n < 2) throw new RecordingInputError(file, null, n === 0 ? 'no data rows' : 'only one data row; a recording needs many');
  const columns: [string, Float64Array | null][] = [['angle', angle], ['gyro', input.gyroDps ?? null], ['emg', input.emgUv ?? null]];
  for (const [name, column] of columns) {
    if (column && column.length !== n) throw new RecordingInputError(file, null, `${name} column has ${column.length} samples, time has ${n}`);
  }
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(timeS[i])) throw new RecordingInputError(file, lineOf(i), 'non-finite time');
    if (i > 0 && !(timeS[i] > timeS[i - 1])) throw new RecordingInputError(file, lineOf(i), 'time not strictly increasing');
  }
  for (const [name, column] of columns) {
    if (!column) continue;
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(column[i])) throw new RecordingInputError(file, lineOf(i), `non-finite ${name} value`);
    }
  }
  if (!angle) return;
  const { min, max } = ANGLE_LIMITS_DEG;
  for (let i = 0; i < n; i++) {
    if (angle[i] < min || angle[i] > max) {
      throw new RecordingInputError(file, lineOf(i), `angle ${roundTo(angle[i], 3)} degrees outside ${min}..${max} degrees`);
    }
  }
}
