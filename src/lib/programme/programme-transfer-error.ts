/**
 * Why a programme package or a home report was refused. Each keeps its cause.
 * - WrongCode: the code typed does not open the file (nothing read, nothing written).
 * - Tampered: the file opens with the code but its content was altered or truncated.
 * - NotThisKind: the file is not a Kinnote programme package (or not a home report) at all.
 * - Unsupported: a newer format version than this app reads.
 * - Invalid: the file opens but breaks a rule of its format (fields, lengths, dates).
 * - ForeignPatient: the file holds another person's data than the one expected here.
 * - Incomplete: QR parts are missing or belong to different files.
 */
export type ProgrammeTransferErrorCode = 'WrongCode' | 'Tampered' | 'NotThisKind' | 'Unsupported' | 'Invalid' | 'ForeignPatient' | 'Incomplete';

/** The one error type of the home-programme hand-off. */
export class ProgrammeTransferError extends Error {
  override readonly name = 'ProgrammeTransferError';
  constructor(
    readonly code: ProgrammeTransferErrorCode,
    message: string,
    options: { cause?: unknown } = {},
  ) {
    super(message, options.cause === undefined ? undefined : { cause: options.cause });
  }
}
