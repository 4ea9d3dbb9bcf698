/**
 * Input the sensor code refuses: a malformed motion CSV file, or a recording from which no knee
 * angle can be reconstructed (no motion, no still start). The message names the file, the row
 * (1-based line in the file, header = line 1) when one row is at fault, and the reason.
 */
export class MotionInputError extends Error {
  override readonly name = 'MotionInputError';
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
