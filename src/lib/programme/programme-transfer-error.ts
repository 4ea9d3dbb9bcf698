import type { DoseField, DoseProblem } from '../domain';

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

/** An exercise's dose problem that made a file Invalid (exercise 1 = the first), for the patient's screen to word in its language. */
export interface RefusedDose {
  readonly exercise: number;
  readonly field: DoseField | null;
  readonly problem: DoseProblem;
}

/** The one error type of the home-programme hand-off. `message` is English; `dose` says which dose problem refused the file. */
export class ProgrammeTransferError extends Error {
  override readonly name = 'ProgrammeTransferError';
  readonly dose: RefusedDose | null;
  constructor(
    readonly code: ProgrammeTransferErrorCode,
    message: string,
    options: { cause?: unknown; dose?: RefusedDose | null } = {},
  ) {
    super(message, options.cause === undefined ? undefined : { cause: options.cause });
    this.dose = options.dose ?? null;
  }
}
