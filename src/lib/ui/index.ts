// Public face of src/lib/ui: shared Svelte components and page-side helpers.
export { default as UpdateBanner } from './UpdateBanner.svelte';
export { updateWatch } from './update-watch.svelte';
export { default as ChoiceButtons } from './ChoiceButtons.svelte';
export { default as OtherDrafts } from './OtherDrafts.svelte';
export { default as VirtualList } from './VirtualList.svelte';
export { type AssessmentDraft, type DraftIssue, type InstrumentRow, type ObservationDraft, draftConditions, draftObservations, emptyDraft } from './assessment-draft';
export { type CaseloadFilter, type CaseloadRow, caseloadRows, filterCaseload } from './caseload-summary';
export { downloadBlob, downloadText } from './download';
export { type DraftChoice, DraftKeeper, keepDraftWhenLeaving } from './draft-keeper';
export { default as Inclinometer } from './instruments/Inclinometer.svelte';
export { default as PendulumCautions } from './instruments/PendulumCautions.svelte';
export { default as PendulumFile } from './instruments/PendulumFile.svelte';
export { default as PendulumPhone } from './instruments/PendulumPhone.svelte';
export { default as PendulumResult } from './instruments/PendulumResult.svelte';
export { saveReadingAndReturn } from './instruments/save-reading-alone';
export { localMdcList } from './local-mdc';
export { INSTRUMENT_MESSAGES } from './messages/instrument-messages';
export { PATIENT_PAGE_MESSAGES } from './messages/patient-page-messages';
export { REPORT_MESSAGES } from './messages/report-messages';
export { type OverviewGroup, overviewGroups } from './overview-groups';
export { default as AdherenceSummary } from './programme/AdherenceSummary.svelte';
export { default as DoseLine } from './programme/DoseLine.svelte';
export { default as ExercisePhotosEditor } from './programme/ExercisePhotosEditor.svelte';
export { default as LanguageChoice } from './programme/LanguageChoice.svelte';
export { default as PhotoImage } from './programme/PhotoImage.svelte';
export { default as QrCodes } from './programme/QrCodes.svelte';
export { default as QrReader } from './programme/QrReader.svelte';
export { default as TickChoice } from './programme/TickChoice.svelte';
export { type PatientHome, loadPatientHome, localToday, plansOn, removeEverythingFromThisPhone } from './programme/patient-home';
export { patientLanguage } from './programme/patient-language.svelte';
export { QR_MESSAGES } from './programme/qr-messages';
export { refusedProgrammeText } from './programme/refused-programme';
export { type ReminderSettings, loadReminders, notificationSupport, saveReminders, scheduleReminders, showReminder } from './programme/reminders';
export { shareOrDownload } from './programme/share-file';
export { PATIENT_LANGUAGE_SELF_NAMES, THERAPIST_MESSAGES } from './programme/therapist-messages';
export { ADOPTED_ICC_FORM, type ReliabilityResult, reliabilityResult, studyTable } from './reliability-table';
export { describeError, session } from './session.svelte';
export { type ShareOutcome, canShareFiles, shareOrDownloadFile } from './share-or-download';
export { default as TeamSection } from './team/TeamSection.svelte';
export { visitContents } from './visit-contents';
export { type KeptVisit, visitDraftKeeper, visitDraftSize } from './visit-draft';
export { VISIT_MESSAGES } from './visit-messages';
export {
  type AngleMeasure,
  type AngleRow,
  type FormRow,
  type GradeMeasure,
  type GradeRow,
  type RatingMeasure,
  type RowMeasure,
  type TardieuFormMeasure,
  type TardieuRow,
  angleNote,
  formMeasure,
  formSections,
  gradeOptions,
  newRow,
  qualityOptions,
  ratingOptions,
  rowMeasure,
} from './visit-form-layout';
export {
  type KeptProtocol,
  PENDULUM_PRIMARY,
  VISIT_FORM_MEASURES,
  chooseProtocol,
  describeValue,
  draftFromProtocol,
  draftFromVisit,
  lastObservations,
  missingReadings,
  protocolFromDraft,
  protocolStateKey,
  readingForRow,
  rowCount,
} from './visit-protocol';
export { type UnreadableReading, type VisitReading, readingSaveInputs, repeatedReadings } from './visit-readings';
