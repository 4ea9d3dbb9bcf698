// Public face of src/lib/sensors: other folders import only this file.
// The signal code (./signal) is pure; the browser adapter and the Svelte parts sit beside it.
export {
  MotionInputError,
  parseMotionCsv,
  formatMotionCsv,
  formatAngleTraceCsv,
  analyseMotionRecording,
  axisAngleToVerticalDeg,
  angleBetweenDeg,
  steadyReading,
  LiveSwingMonitor,
  type MotionRecording,
  type KneeAngleReconstruction,
  type SteadyReading,
} from './signal';
export {
  DeviceMotionSource,
  describeMotionProblem,
  requestMotionPermission,
  type MotionProblem,
} from './device-motion-source';
export { romObservation, motionTraceChannels } from './sensor-records';
export { reanalyseSavedRecording } from './reanalyse-saved-recording';
export { fileStamp } from './ui/file-stamp';
