// Pure signal code of src/lib/sensors: no DOM, no clock, no storage. Runs in Node, workers and the page.
export { MotionInputError } from './motion-input-error';
export { rateAxisOrder, type RateAxisOrder, type RateAxisOrderEvidence } from './rate-axis-order';
export { MOTION_CSV_COLUMNS, RATE_AXES_NOTE, STANDARD_GRAVITY_MS2, deviceAngularVelocity, motionSampleCount, type MotionRecording } from './motion-recording';
export { parseMotionCsv } from './parse-motion-csv';
export { formatMotionCsv, formatAngleTraceCsv } from './format-motion-csv';
export { motionTiming, LOW_RATE_HZ, type MotionTiming } from './motion-timing';
export { principalAxis, type PrincipalAxis } from './principal-axis';
export {
  reconstructKneeAngle,
  MOUNTING_TILT_BOUND_DEG,
  type KneeAngleOptions,
  type KneeAngleReconstruction,
} from './reconstruct-knee-angle';
export { wrap180 } from './vector3';
export { analyseMotionRecording, type MotionPendulumResult } from './analyse-motion-recording';
export { axisAngleToVerticalDeg, angleBetweenDeg, type DeviceAxis } from './inclination';
export { steadyReading, type SteadyLimits, type SteadyReading } from './steady-hold';
export { MotionBuffer } from './motion-buffer';
export { LiveSwingMonitor, type LiveSwingState } from './live-swing-monitor';
