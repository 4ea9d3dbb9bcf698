/**
 * Input the pendulum engine refuses: a malformed CSV file or a recording that cannot be analysed
 * (no release, no rest, too slow a sampling rate). The message names the file, the row (1-based line
 * number in the file, the header being line 1) when one row is at fault, and the reason.
 */
export class PendulumInputError extends Error {
  override readonly name = 'PendulumInputError';
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
