// Public face of src/lib/pendulum: other folders import only this file.
// Pure TypeScript: no DOM, storage or clock, so it runs in Node, in a Web Worker and in the page.
export { analysePendulumTrace, TYPICAL_RELAXATION_INDEX } from './analyse-pendulum-trace';
export { ANGLE_CUTOFF_HZ, MIN_SAMPLE_RATE_HZ } from './uniform-grid';
export { PEAK_COUNT_MARGIN_DEG } from './swing-peaks';
export { DOMINANT_AREA_RATIO } from './side-areas';
export type { PendulumTraceInput, PendulumOptions } from './analyse-pendulum-trace';
export { analysePendulumCsv, parseAndAnalysePendulumCsv, type PendulumCsvResult } from './analyse-pendulum-csv';
export { parsePendulumCsv } from './parse-pendulum-csv';
export { ANGLE_LIMITS_DEG } from '../domain';
export type { PendulumTrace } from './parse-pendulum-csv';
export { PendulumInputError } from './pendulum-input-error';
export { pendulumInputFromTrace, type StoredTraceColumns } from './pendulum-input-from-trace';
export { pendulumObservations, type PendulumObservation } from './pendulum-observations';
export type {
  PendulumAnalysis,
  PendulumIndices,
  PendulumFitIndices,
  PendulumEmgIndices,
  PendulumEmgBurst,
  PendulumEmgPhase,
  PendulumSignals,
} from './pendulum-result';
// Building blocks, exported for reuse (sensors) and for their own tests.
export { butterworthLowPass } from './butterworth-low-pass';
export { zeroPhaseFilter } from './zero-phase-filter';
export { resampleLinear } from './resample-linear';
export { uniformSampleRate } from './uniform-sample-rate';
export type { SampleTiming } from './uniform-sample-rate';
export { removeSpikes, median5At } from './remove-spikes';
export { centralDifference } from './central-difference';
export { prominentPeaks } from './prominent-peaks';
export { detectRelease } from './detect-release';
export type { Release } from './detect-release';
export { detectRest, REST_WINDOW_S } from './detect-rest';
export type { RestPlateau } from './detect-rest';
export { integrateGyro } from './integrate-gyro';
export { fitDampedCosine } from './fit-damped-cosine';
export { dampedCosineDeg, dampedCosineFitDeg, type DampedCosineParameters } from './damped-cosine';
export type { DampedCosineFit, DampedCosineStart } from './fit-damped-cosine';
export { emgEnvelope } from './emg-envelope';
export { quickselect, medianInPlace } from './quickselect';
