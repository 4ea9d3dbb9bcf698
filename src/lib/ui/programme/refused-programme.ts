import type { ProgrammeTransferError } from '$lib/programme';
import type { PatientMessages } from './patient-messages';

/**
 * What the patient's phone says when a programme file is refused: a dose the therapist must
 * correct is worded in the patient's language from its code (the exercise, the field and the
 * problem); any other refusal by the error's code (the English `message` is for the therapist's
 * screens and logs, never shown to a patient).
 */
export function refusedProgrammeText(error: ProgrammeTransferError, m: PatientMessages): string {
  const dose = error.dose;
  if (!dose) return m.receiveRefused(error.code);
  return m.receiveDoseRefused(dose.exercise, dose.field === null ? null : m.doseField(dose.field), m.doseProblem(dose.problem));
}
