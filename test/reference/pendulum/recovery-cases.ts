// Conditions under which the engine must recover the simulator's own indices, shared by the
// recovery test and by the figures printed for the report (`npx tsx test/reference/pendulum/recovery-table.ts`).
import { analysePendulumTrace, type PendulumIndices } from '../../../src/lib/pendulum/index';
import {
  addDrift,
  addNoise,
  addSpikes,
  mulberry32,
  quantise,
  reflexForSeverity,
  sampleTrace,
  simulatePendulum,
  toGyroOnly,
  type PendulumSimulationOptions,
  type SimulatedIndices,
} from './simulator';
import { deepFreeze } from '../../support/deep-freeze';

export const LEGS: Record<string, PendulumSimulationOptions> = deepFreeze({
  relaxed: {},
  'extensor moderate': { reflex: reflexForSeverity('extensor', 'moderate'), startAngleDeg: 10, hangingAngleDeg: 80 },
  'extensor severe': { reflex: reflexForSeverity('extensor', 'severe'), startAngleDeg: 25, hangingAngleDeg: 95, holdS: 0.4 },
  'flexor moderate': { reflex: reflexForSeverity('flexor', 'moderate'), startAngleDeg: 35, hangingAngleDeg: 65, holdS: 2.5, timeOffsetS: 314.2 },
});

export interface Condition {
  readonly rateHz: number;
  readonly make: (s: ReturnType<typeof sampleTrace>, rng: () => number) => ReturnType<typeof sampleTrace>;
  readonly gyroStartFromTruth?: boolean;
}

export const CONDITIONS: Record<string, Condition> = deepFreeze({
  'clean 1000 Hz': { rateHz: 1000, make: (s) => s },
  'clean 50 Hz': { rateHz: 50, make: (s) => s },
  'clean 100 Hz': { rateHz: 100, make: (s) => s },
  'clean 200 Hz': { rateHz: 200, make: (s) => s },
  'clean 500 Hz': { rateHz: 500, make: (s) => s },
  'noise 0.5° at 100 Hz': { rateHz: 100, make: (s, r) => ({ ...s, angleDeg: addNoise(s.angleDeg as Float64Array, 0.5, r) }) },
  'noise 0.5° at 1000 Hz': { rateHz: 1000, make: (s, r) => ({ ...s, angleDeg: addNoise(s.angleDeg as Float64Array, 0.5, r) }) },
  'drift 0.1°/s': { rateHz: 200, make: (s) => ({ ...s, angleDeg: addDrift(s.angleDeg as Float64Array, s.timeS, 0.1) }) },
  'quantised 0.5°': { rateHz: 200, make: (s) => ({ ...s, angleDeg: quantise(s.angleDeg as Float64Array, 0.5) }) },
  'spikes 8 × 25°': { rateHz: 200, make: (s, r) => ({ ...s, angleDeg: addSpikes(s.angleDeg as Float64Array, 8, 25, r) }) },
  'jitter ±20 % at 100 Hz': { rateHz: 100, make: (s) => s },
  'gyro only 100 Hz': {
    rateHz: 100,
    make: (s, r) => toGyroOnly(s, { biasDps: 2, biasDriftDpsPerS: 0.05, noiseDps: 1 }, r),
    gyroStartFromTruth: true,
  },
  'gyro only 1000 Hz': {
    rateHz: 1000,
    make: (s, r) => toGyroOnly(s, { biasDps: -3, biasDriftDpsPerS: 0.1, noiseDps: 2 }, r),
    gyroStartFromTruth: true,
  },
});

export interface Recovery {
  readonly truth: SimulatedIndices;
  readonly engine: PendulumIndices;
}

/** Simulates one leg, degrades it under one condition, and analyses it. */
export function recover(leg: string, condition: string, seed = 11): Recovery {
  const sim = simulatePendulum({ durationS: 14, ...LEGS[leg] });
  const c = CONDITIONS[condition];
  const rng = mulberry32(seed);
  const jitter = condition.startsWith('jitter') ? 0.2 : 0;
  const sampled = c.make(sampleTrace(sim, c.rateHz, jitter, rng), rng);
  const analysis = analysePendulumTrace(
    { timeS: sampled.timeS, angleDeg: sampled.angleDeg, gyroDps: sampled.gyroDps },
    { fileName: `${leg} ${condition}`, ...(c.gyroStartFromTruth ? { gyroStartAngleDeg: sim.truth.startAngleDeg } : {}) },
  );
  return { truth: sim.truth, engine: analysis.indices };
}

/** Absolute errors of each compared index. */
export function errors(r: Recovery): Record<string, number> {
  const { truth: t, engine: e } = r;
  return {
    releaseMs: 1000 * Math.abs(e.releaseTimeS - t.releaseTimeS),
    startDeg: Math.abs(e.startAngleDeg - t.startAngleDeg),
    restDeg: Math.abs(e.restAngleDeg - t.restAngleDeg),
    firstPeakDeg: Math.abs(e.firstPeakDeg - t.firstPeakDeg),
    firstPeakMs: 1000 * Math.abs(e.firstPeakTimeS - t.firstPeakTimeS),
    r2: Math.abs(e.relaxationIndex - t.relaxationIndex),
    peakCount: Math.abs(e.peakCount - t.peakCount),
    periodMs: t.firstPeriodS === null || e.firstPeriodS === null ? (t.firstPeriodS === e.firstPeriodS ? 0 : Number.POSITIVE_INFINITY) : 1000 * Math.abs(e.firstPeriodS - t.firstPeriodS),
    velocityPct: (100 * Math.abs(e.peakFlexionVelocityDps - t.peakFlexionVelocityDps)) / t.peakFlexionVelocityDps,
    flexionAreaDegS: Math.abs(e.flexionAreaDegS - t.flexionAreaDegS),
    extensionAreaDegS: Math.abs(e.extensionAreaDegS - t.extensionAreaDegS),
  };
}
