import { roundTo } from '../stats';
import { angleStage, type AngleStage } from './angle-stage';
import { gyroAngleStage } from './gyro-angle-stage';
import type { PendulumOptions, PendulumTraceInput } from './pendulum-trace-input';
import { removeSpikes } from './remove-spikes';
import { resampleLinear } from './resample-linear';
import { edgePad, type UniformGrid } from './uniform-grid';
import { zeroPhaseFilter } from './zero-phase-filter';

const SPIKE_FLOOR_DEG = 3;
const SPIKE_FLOOR_DPS = 50;

/** The angle stage and, when the recording has a gyro column, its filtered rate and removed bias. */
export interface TraceAngle {
  readonly stage: AngleStage;
  readonly gyroFilteredDps: Float64Array | null;
  /** Bias removed from the gyro at each grid sample (gyro-only input), else null. */
  readonly gyroBias: ((i: number) => number) | null;
}

/**
 * Step 3 of analysePendulumTrace: resample the columns to the grid, replace isolated spikes, and
 * build the angle stage from the angle column or, without one, from the integrated gyro.
 */
export function traceAngle(file: string, input: PendulumTraceInput, grid: UniformGrid, options: PendulumOptions, lastLine: number, warnings: string[]): TraceAngle {
  const { timeS } = input;
  const { startS, rateHz: fs, length: m } = grid;
  let gyroRaw: Float64Array | null = null;
  let gyroFilteredDps: Float64Array | null = null;
  let spikes = 0;
  if (input.gyroDps) {
    gyroRaw = resampleLinear(timeS, input.gyroDps, startS, fs, new Float64Array(m));
    spikes += removeSpikes(gyroRaw, SPIKE_FLOOR_DPS);
    gyroFilteredDps = zeroPhaseFilter(grid.sos, gyroRaw, new Float64Array(m), edgePad(fs, grid.cutoffHz));
  }
  let stage: AngleStage;
  let gyroBias: ((i: number) => number) | null = null;
  if (input.angleDeg) {
    const angleRaw = resampleLinear(timeS, input.angleDeg, startS, fs, new Float64Array(m));
    spikes += removeSpikes(angleRaw, SPIKE_FLOOR_DEG);
    stage = angleStage(file, angleRaw, grid, lastLine);
  } else {
    const startAngle = options.gyroStartAngleDeg ?? 0;
    const result = gyroAngleStage(file, gyroRaw as Float64Array, gyroFilteredDps as Float64Array, grid, startAngle, lastLine, warnings);
    stage = result.stage;
    gyroBias = result.bias;
    warnings.push(
      `angle reconstructed from gyro_dps; absolute angles assume the leg was held at ${roundTo(startAngle, 2)}° (A0, A1, R2 and areas do not depend on this)`,
    );
  }
  if (spikes > 0) warnings.push(`${spikes} isolated spike${spikes === 1 ? '' : 's'} replaced by the local median`);
  return { stage, gyroFilteredDps, gyroBias };
}
