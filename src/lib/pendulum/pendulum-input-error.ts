import { RecordingInputError } from '../domain';

/**
 * Input the pendulum engine refuses: the domain's one recording-input error under the name the
 * engine's callers know (file, row when one row is at fault, reason). `instanceof` works with either name.
 */
export const PendulumInputError = RecordingInputError;
export type PendulumInputError = RecordingInputError;
