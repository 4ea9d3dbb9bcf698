/**
 * A recording Kinnote refuses: a malformed pendulum or motion CSV file, or a recording from which no
 * result can be drawn (no release, no rest, too slow a sampling rate, no knee angle from the phone).
 * The message names the file, the row (1-based line in the file, the header being line 1) when one
 * row is at fault, and the reason. The pendulum engine and the sensor code throw this one class
 * (their older names, PendulumInputError and MotionInputError, are the same class).
 *
 * @example
 * const error = new RecordingInputError('swing.csv', 14, 'non-finite angle value');
 * error.message; // 'swing.csv: row 14: non-finite angle value'
 * error.reason; // 'non-finite angle value'
 */
export class RecordingInputError extends Error {
  override readonly name = 'RecordingInputError';
  /** File name as given by the caller (for messages only). */
  readonly fileName: string;
  /** 1-based line in the file, or null when the reason concerns the whole recording. */
  readonly line: number | null;
  /** The reason alone, without file and row. */
  readonly reason: string;

  constructor(fileName: string, line: number | null, reason: string) {
    super(line === null ? `${fileName}: ${reason}` : `${fileName}: row ${line}: ${reason}`);
    this.fileName = fileName;
    this.line = line;
    this.reason = reason;
  }
}

/**
 * The physically possible knee angles a recording may hold (degrees, 0 = full extension, flexion
 * positive): a little hyperextension to well past full flexion. Values outside are refused as a
 * recording fault (units, a wrong column), never clipped.
 */
export const ANGLE_LIMITS_DEG = { min: -30, max: 180 } as const;
