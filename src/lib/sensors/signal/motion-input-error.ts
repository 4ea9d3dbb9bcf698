import { RecordingInputError } from '../../domain';

/**
 * Input the sensor code refuses: the domain's one recording-input error under the name the sensor
 * code's callers know (file, row when one row is at fault, reason). `instanceof` works with either name.
 */
export const MotionInputError = RecordingInputError;
export type MotionInputError = RecordingInputError;
