// Public face of src/lib/export: CSV (RFC 4180), de-identification, FHIR R4.
export { csvRow } from './csv-cell';

// Cohort audit: selection, summary, de-identification and streamed files (long, wide, summary CSV; FHIR R4).
export { CohortExportError } from './cohort-export-error';
export type { CohortCondition, CohortFilters, CohortRecords, CohortSetting, CohortSide, LocalMdc } from './cohort-types';
export { buildCohortIndex } from './cohort-index';
export { countCohort, selectCohort, type CohortCount } from './select-cohort';
export { summariseCohort, type CohortGroupSummary, type CohortSummary } from './summarise-cohort';
export {
  type Disclosure,
} from './prepare-disclosure';
export { disclosureFromRequest, type CohortDisclosureRequest } from './disclosure-from-request';
export {
  COHORT_FILE_KINDS,
  CohortExportCancelled,
  prepareCohortExport,
  cohortFileName,
  runCohortExport,
  type CohortExportProgress,
  type CohortFileKind,
} from './export-cohort';
export { patientObservationsCsv } from './patient-observations-csv';
export { localDateTime } from './local-date-time';
export {
  clinicianLabel,
  defaultReportEvent,
  referralReport,
  type ReferralReport,
  type ReportChart,
  type ReportMeasure,
  type ReportScope,
} from './referral-report';
export { REPORT_CHART_AXIS_PX, REPORT_CHART_BOX, reportChartGeometry } from './report-chart-geometry';
export { REPORT_TITLE, REPORT_HEADINGS, REPORT_COLUMNS, REPORT_CHART_LEGEND, NO_INTERVENTIONS_TEXT, NO_VISITS_TEXT, reportDayFormatter, reportWeekFormatter, reportWhoParts, reportPreparedLines, reportScopeParts, interventionDetails, notRemeasuredText, weekShareText, reportVisitLines, reportFooterText } from './report-wording';
// The report's PDF (referral-report-pdf.ts) is not exported here: it brings pdf-lib (~200 KB gzip), so the
// page imports it by its own path, on demand.
