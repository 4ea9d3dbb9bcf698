// Public face of src/lib/sensors: other folders import only this file.
// The signal code (./signal) is pure; the browser adapter and the Svelte parts sit beside it.
export * from './signal';
export {
  DeviceMotionSource,
  describeMotionProblem,
  motionApiPresent,
  requestMotionPermission,
  type MotionProblem,
  type MotionSourceCallbacks,
  type PermissionOutcome,
} from './device-motion-source';
// The pendulum measures are built by the engine's own helper, for a file or a phone recording alike.
export { pendulumObservations } from '../pendulum';
export { DERIVED_ANGLE_CHANNEL, PHONE_MOTION_CHANNELS, romObservation, motionTraceChannels } from './sensor-records';
export { reanalyseSavedRecording, type AddedValue, type ReanalysedValue, type ReanalysisOutcome } from './reanalyse-saved-recording';
export { fileStamp } from './ui/file-stamp';
