// Public face of src/lib/pendulum: other folders import only this file.
// Pure TypeScript: no DOM, storage or clock, so it runs in Node, in a Web Worker and in the page.
export { analysePendulumTrace } from './analyse-pendulum-trace';
export { analysePendulumCsv, parseAndAnalysePendulumCsv, type PendulumCsvResult } from './analyse-pendulum-csv';
export { PendulumInputError } from './pendulum-input-error';
export { PENDULUM_FILE_CHANNEL_NAMES, pendulumInputFromTrace } from './pendulum-input-from-trace';
export { pendulumObservations } from './pendulum-observations';
export type {
  PendulumAnalysis,
  PendulumIndices,
} from './pendulum-result';
export { dampedCosineFitDeg, type DampedCosineParameters } from './damped-cosine';
export { medianInPlace } from './quickselect';
