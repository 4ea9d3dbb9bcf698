// Kept apart from programme-package.ts (which needs the store) so the first screen's patient messages
// can import it by path without pulling the programme folder into the first load.

/** The languages the patient's screens speak (BCP 47 primary subtags); English is the source. */
export const PATIENT_LANGUAGES = ['en', 'es'] as const;
export type PatientLanguage = (typeof PATIENT_LANGUAGES)[number];
export function isPatientLanguage(value: unknown): value is PatientLanguage {
  return typeof value === 'string' && (PATIENT_LANGUAGES as readonly string[]).includes(value);
}
