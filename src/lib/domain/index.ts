// Public face of src/lib/domain: other folders import only this file.
// Pure TypeScript: records, their valibot schemas, the measure catalogue and UUIDv7 ids.
export { type ValidationIssue } from './domain-error';
export { ANGLE_LIMITS_DEG, RecordingInputError } from './recording-input-error';
export { formatFixed } from './format-fixed';
export { dateWriter } from './date-writer';
export { createUuidV7Generator, formatUuidV7, type RandomBytes } from './uuid-v7';
export {
  IdSchema,
  IsoDateSchema,
  IsoDateTimeSchema,
  type RecordBase,
  type RecordInput,
  type Side,
} from './record-base';
export { CONDITION_CATEGORIES, patientCode, type Patient } from './patient';
export { IdentityFieldsSchema, type Identity, type IdentityFields } from './identity';
export { PROFESSIONS, type Clinician } from './clinician';
export { DeviceSchema, type Device } from './device';
export { EVENT_KIND_LABELS, EVENT_KINDS, type ClinicalEvent, type EventKind } from './event';
export { ASSESSMENT_SETTINGS, POSITIONS, type Assessment } from './assessment';
export {
  OBSERVATION_SIDES,
  type Instrument,
  type Observation,
  type ObservationValue,
  type RomMode,
} from './observation';
export { type Trace } from './trace';
export { HomeProgrammeSchema, type HomeProgramme } from './home-programme';
export { EMPTY_DOSE, ExerciseDoseSchema, MAX_DOSE_NOTE_LENGTH, MAX_TIMES_PER_DAY, doseFromLegacyLine, doseIssueOf, doseProblemText, type DoseField, type DoseIssue, type DoseProblem, type ExerciseDose } from './exercise-dose';
export { AdherenceEntrySchema, type AdherenceEntry } from './adherence-entry';
export { SelfReportSchema, type SelfReport } from './self-report';
export { RELIABILITY_DESIGNS, type ReliabilityStudy } from './reliability-study';
export { type AuditAction, type AuditEntry } from './audit-entry';
export type {
  ImprovementDirection,
  Measure,
  OrdinalGrade,
} from './measure-types';
export { MEASURE_CATALOGUE, findMeasure, findSite } from './measure-catalogue';
export { checkObservation, ordinalValue, tardieuValue } from './check-observation';
export { EARLIEST_TIMESTAMP, MAX_CLOCK_SKEW_MS, checkTimestamps } from './timestamp-bounds';
export { referencedIds } from './record-references';
export { errorReference, referenceMdc95 } from './reference-mdc';
export {
  PROTECTED_TEXT_FIELDS,
  TABLE_NAMES,
  isTableName,
  validateRecord,
  type RecordTables,
  type TableName,
} from './record-tables';
export { validateObservation } from './validate-observation';
export { decimalProblem, decimalValue, readDecimal, readWholeNumber } from './read-decimal';
export { readCalendarDate } from './read-calendar-date';
export { withoutByteOrderMark } from './without-byte-order-mark';
export {
  MAX_PHOTOS_PER_EXERCISE,
  MAX_PHOTO_BYTES,
  PHOTO_TYPES,
  exercisePhotoProblem,
  photoEncodingAttempts,
  sniffPhotoType,
  type ExercisePhoto,
  type PhotoEncodingAttempt,
  type PhotoType,
} from './exercise-photo';
export { VISIT_TEMPLATES, templateTests, type VisitTemplate } from './visit-templates';
