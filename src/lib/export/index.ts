// Public face of src/lib/export: CSV (RFC 4180), de-identification, FHIR R4.
export { csvCell, csvRow, csvUnit } from './csv-cell';

// Cohort audit: selection, summary, de-identification and streamed files (long, wide, summary CSV; FHIR R4).
export { CohortExportError } from './cohort-export-error';
export type { CohortCondition, CohortFilters, CohortRecords, CohortSetting, CohortSide, EventAnchor, LocalMdc } from './cohort-types';
export { buildCohortIndex, type CohortIndex, type CohortSeries, type DatedEvent } from './cohort-index';
export { countCohort, selectCohort, type Cohort, type CohortCount, type CohortPair } from './select-cohort';
export { measureQuantities, type MeasureQuantity } from './measure-quantities';
export { groupKey, pairChange, summariseCohort, type CohortGroupSummary, type CohortSummary, type PairChange, type SummariseOptions } from './summarise-cohort';
export {
  birthYearBand,
  prepareDisclosure,
  SYNTHETIC_ANCHOR_DATE,
  type DeidentifiedDates,
  type Disclosure,
  type DisclosurePlan,
  type PatientView,
} from './prepare-disclosure';
export { disclosureFromRequest, type CohortDisclosureRequest } from './disclosure-from-request';
export { longCsvChunks, longCsvHeader } from './long-csv';
export { wideCsvChunks, wideCsvHeader } from './wide-csv';
export { SUMMARY_CSV_HEADER, summaryCsvChunks } from './summary-csv';
export {
  fhirBundleChunks,
  KINNOTE_MEASURE_SYSTEM,
  KINNOTE_SITE_SYSTEM,
  KINNOTE_GRADE_SYSTEM_PREFIX,
  KINNOTE_TARDIEU_PART_SYSTEM,
  KINNOTE_EXPORT_TAG_SYSTEM,
  KINNOTE_PSEUDONYM_SYSTEM,
  UCUM,
} from './fhir-bundle';
export { ChunkBuilder, collectText, DEFAULT_CHUNK_CHARS, type TextChunk } from './text-chunk';
export {
  COHORT_FILE_KINDS,
  CohortExportCancelled,
  prepareCohortExport,
  cohortFileName,
  runCohortExport,
  type CohortExportHooks,
  type CohortExportOptions,
  type CohortExportProgress,
  type CohortFile,
  type CohortFileKind,
  type PreparedCohortExport,
} from './export-cohort';
export { eventContext, patientObservationsCsv, PATIENT_CSV_COLUMNS, type PatientCsvOptions } from './patient-observations-csv';
export { localDateTime, type LocalDateTime } from './local-date-time';
export {
  clinicianLabel,
  defaultReportEvent,
  referralReport,
  ReferralReportError,
  REPORT_CAUTIONS,
  type ReferralReport,
  type ReferralReportInput,
  type ReportAdherence,
  type ReportAdherenceWeek,
  type ReportChart,
  type ReportIntervention,
  type ReportMeasure,
  type ReportScope,
  type ReportVerdict,
  type ReportVisit,
} from './referral-report';
export { REPORT_CHART_AXIS_PX, REPORT_CHART_BOX, reportChartGeometry, type ChartBox, type ChartGeometry } from './report-chart-geometry';
export * from './report-wording';
// The report's PDF (referral-report-pdf.ts) is not exported here: it brings pdf-lib (~200 KB gzip), so the
// page imports it by its own path, on demand.
