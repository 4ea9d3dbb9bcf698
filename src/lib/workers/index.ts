// Public face of src/lib/workers: page-side clients of the Web Workers that run core modules.
export { analysePendulumFile, PendulumAnalysisError } from './analyse-pendulum-file';
