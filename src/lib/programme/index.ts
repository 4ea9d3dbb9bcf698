// Public face of src/lib/programme: the home programme on the patient's own phone and its
// hand-off with the therapist (encrypted programme packages and reports, QR parts, adherence).
// Pure formats and computations, plus thin store glue (patient-device, home-records,
// import-home-report); no DOM anywhere here.
export { ProgrammeTransferError, type ProgrammeTransferErrorCode } from './programme-transfer-error';
export { addDays, dayNumber, localDayOf, weekStartOf } from './calendar';
export {
  ExercisePlanSchema,
  ExerciseSchema,
  MAX_EXERCISES,
  MAX_SESSIONS_PER_WEEK,
  MAX_TIMES_PER_DAY,
  checkExercisePlan,
  doseSchedule,
  sessionsInFullWeek,
  ticksPerDay,
  type DoseSchedule,
  type Exercise,
  type ExercisePlan,
  type PlanIssue,
} from './exercise-plan';
export { doseParts, durationWords, type DosePart } from './dose-parts';
export { freeTextExercises, planToProgrammeInput, programmeToPlan } from './programme-record';
export { activeDaysInWeek, planRunsOn, plannedSessionsInWeek, plannedSessionsOfExercise, weeksOfPlan } from './planned-sessions';
export { EMPTY_HOME_LOG, TICK_STATUSES, findTick, readHomeLog, withTick, withoutTick, type ExerciseTick, type HomeLog, type TickStatus } from './home-log';
export { adherenceByWeek, weeklyAdherence, type RecordedWeek, type WeekAdherence } from './weekly-adherence';
export { followedPlans, type FollowedPlan } from './current-plans';
export { HANDOVER_CODE_LENGTH, handoverCode, normaliseHandoverCode } from './handover-code';
export { MAX_QR_PARTS, QR_PAYLOAD_CHARS, QrPartCollector, fnv1a32Hex, splitIntoQrParts, type QrScanResult } from './qr-chunks';
export { type SealOptions } from './sealed-transfer';
export {
  PROGRAMME_PACKAGE_FORMAT,
  PROGRAMME_PACKAGE_VERSION,
  createProgrammePackage,
  openProgrammePackage,
  type OpenedProgrammePackage,
  type ProgrammePackage,
} from './programme-package';
export { PATIENT_LANGUAGES, isPatientLanguage, type PatientLanguage } from './patient-language';
export { HOME_REPORT_FORMAT, HOME_REPORT_VERSION, createHomeReport, openHomeReport, type HomeReport } from './home-report';
export { acceptProgrammePackage } from './patient-device';
export { choosePatientMode, readDeviceProfile, writeDeviceProfile, type DeviceProfile } from './device-profile';
export { gatherHomeReport, loadFollowedPlans, patientPhoneContents, recordedWeeksOf, loadHomeLog, saveSelfReport, saveTick, selfReportOn, syncWeeklyAdherence } from './home-records';
export { importHomeReport, type HomeReportImport } from './import-home-report';
export { summariseReport, type ReportSummary } from './report-summary';
export { dueReminderTime } from './due-reminder';
