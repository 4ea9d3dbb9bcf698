// Public face of src/lib/domain: other folders import only this file.
// Pure TypeScript: records, their valibot schemas, the measure catalogue and UUIDv7 ids.
export { DomainValidationError, type ValidationIssue } from './domain-error';
export { ANGLE_LIMITS_DEG, RecordingInputError } from './recording-input-error';
export { formatFixed } from './format-fixed';
export { createUuidV7Generator, formatUuidV7, isUuidV7, uuidV7Time, type RandomBytes } from './uuid-v7';
export {
  IdSchema,
  IsoDateSchema,
  IsoDateTimeSchema,
  RECORD_BASE_FIELDS,
  SIDES,
  type RecordBase,
  type RecordInput,
  type Side,
} from './record-base';
export { CONDITION_CATEGORIES, PATIENT_STATUSES, PatientSchema, patientCode, type Patient } from './patient';
export { IdentityFieldsSchema, IdentitySchema, type Identity, type IdentityFields } from './identity';
export { ClinicianSchema, PROFESSIONS, type Clinician } from './clinician';
export { DeviceSchema, type Device } from './device';
export { EVENT_KIND_LABELS, EVENT_KINDS, EVENT_SIDES, EventSchema, type ClinicalEvent, type EventKind } from './event';
export { ASSESSMENT_SETTINGS, AssessmentConditionsSchema, AssessmentSchema, POSITIONS, type Assessment } from './assessment';
export {
  INSTRUMENTS,
  OBSERVATION_SIDES,
  ObservationSchema,
  ObservationValueSchema,
  ROM_MODES,
  type Instrument,
  type Observation,
  type ObservationValue,
  type RomMode,
} from './observation';
export { TRACE_KINDS, TraceSchema, type Trace } from './trace';
export { HomeProgrammeItemSchema, HomeProgrammeSchema, type HomeProgramme, type HomeProgrammeItem } from './home-programme';
export { EMPTY_DOSE, ExerciseDoseSchema, MAX_DOSE_NOTE_LENGTH, MAX_TIMES_PER_DAY, doseFromLegacyLine, type ExerciseDose } from './exercise-dose';
export { AdherenceEntrySchema, type AdherenceEntry } from './adherence-entry';
export { SelfReportSchema, type SelfReport } from './self-report';
export { RELIABILITY_DESIGNS, ReliabilityStudySchema, type ReliabilityStudy } from './reliability-study';
export { AUDIT_ACTIONS, AuditEntrySchema, type AuditAction, type AuditEntry } from './audit-entry';
export type {
  ErrorReference,
  EvidenceStatus,
  ImprovementDirection,
  Measure,
  MeasureSite,
  MeasurementErrorFigure,
  NumericMeasure,
  OrdinalGrade,
  OrdinalMeasure,
  RaterDesign,
  TardieuMeasure,
} from './measure-types';
export { MEASURE_CATALOGUE, findMeasure, findSite } from './measure-catalogue';
export { HYPERMOBILITY_MARGIN_DEG, ROM_SITES } from './rom-motions';
export { checkObservation, ordinalValue, tardieuValue } from './check-observation';
export { MAX_AUDIT_SNAPSHOT_CHARS, checkAuditEntry } from './check-audit-entry';
export { EARLIEST_TIMESTAMP, MAX_CLOCK_SKEW_MS, checkTimestamps } from './timestamp-bounds';
export { RECORD_REFERENCES, referencedIds, type RecordReference } from './record-references';
export { SEM_TO_MDC95, errorReference, referenceMdc95, type ReferenceMdc } from './reference-mdc';
export {
  PROTECTED_TEXT_FIELDS,
  TABLE_NAMES,
  isTableName,
  parseRecord,
  validateRecord,
  type RecordTables,
  type TableName,
} from './record-tables';
export { decimalProblem, decimalValue, readDecimal, readWholeNumber, type DecimalReading } from './read-decimal';
export { readCalendarDate } from './read-calendar-date';
export { withoutByteOrderMark } from './without-byte-order-mark';
export {
  MAX_PHOTOS_PER_EXERCISE,
  MAX_PHOTO_BYTES,
  PHOTO_LONGEST_SIDE_PX,
  PHOTO_MIN_LONGEST_SIDE_PX,
  PHOTO_TYPES,
  exercisePhotoProblem,
  fitWithin,
  photoEncodingAttempts,
  sniffPhotoType,
  type ExercisePhoto,
  type PhotoEncodingAttempt,
  type PhotoType,
} from './exercise-photo';
export { VISIT_TEMPLATES, templateTests, type VisitTemplate } from './visit-templates';
