// Public face of src/lib/programme: the home programme on the patient's own phone and its
// hand-off with the therapist (encrypted programme packages and reports, QR parts, adherence).
// Pure formats and computations, plus thin store glue (patient-device, home-records,
// import-home-report); no DOM anywhere here.
export { ProgrammeTransferError, type ProgrammeTransferErrorCode } from './programme-transfer-error';
export { addDays, dayNumber, localDayOf, weekStartOf } from './calendar';
export {
  MAX_EXERCISES,
  MAX_SESSIONS_PER_WEEK,
  checkExercisePlan,
  doseSchedule,
  sessionsInFullWeek,
  ticksPerDay,
  type Exercise,
  type ExercisePlan,
} from './exercise-plan';
export { doseParts, durationWords, type DosePart } from './dose-parts';
export { freeTextExercises, planToProgrammeInput, programmeToPlan } from './programme-record';
export { planRunsOn } from './planned-sessions';
export { findTick, type HomeLog, type TickStatus } from './home-log';
export { adherenceByWeek, weeklyAdherence, type RecordedWeek } from './weekly-adherence';
export { type FollowedPlan } from './current-plans';
export { handoverCode } from './handover-code';
export { QrPartCollector, splitIntoQrParts } from './qr-chunks';
export {
  createProgrammePackage,
  openProgrammePackage,
} from './programme-package';
export { PATIENT_LANGUAGES, isPatientLanguage, type PatientLanguage } from './patient-language';
export { createHomeReport } from './home-report';
export { acceptProgrammePackage } from './patient-device';
export { choosePatientMode, readDeviceProfile } from './device-profile';
export { gatherHomeReport, loadFollowedPlans, patientPhoneContents, recordedWeeksOf, loadHomeLog, saveSelfReport, saveTick, selfReportOn } from './home-records';
export { importHomeReport, type HomeReportImport } from './import-home-report';
export { summariseReport } from './report-summary';
export { dueReminderTime } from './due-reminder';
