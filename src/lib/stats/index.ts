// Public face of src/lib/stats: other folders import only this file.
// Outcome statistics: distributions, reliability (ICC, SEM, MDC), change from baseline, trends and
// cohort summaries. Pure functions over plain data and Float64Array; no UI, storage or clock.
export { StatsInputError } from './stats-input-error';

// Reliability
export { anovaMeanSquares } from './anova-mean-squares';
export { completeSubjects, MissingCellError, type ReliabilityTable } from './complete-subjects';
export {
  intraclassCorrelations,
  type IntraclassCorrelations,
} from './intraclass-correlations';
export { semFromMeanSquareError, mdcFromSem } from './measurement-error';
export { readReliabilityCsv } from './reliability-csv';

// Change
export {
  changeVerdict,
  type ChangeVerdict,
  type MdcProvenance,
  type VerdictKind,
} from './change-verdict';

// Cohort summaries
export { cohortChangeSummary, type CohortChangeSummary } from './cohort-change-summary';

// Series of one patient, ready for the patient page and its charts
export { chooseMdc, mdcSourceLine, type LocalMdc, type MdcChoice } from './choose-mdc';
export { seriesKey, type SeriesIdentity } from './series-key';
export { adoptedLocalMdc, type AdoptableStudy } from './adopted-local-mdc';
export { caseloadSummary, caseloadSummaryBasis, type CaseloadSummary, type SummaryAssessment } from './caseload-summary';
export { latestVerdicts, outcomeSeries, type OutcomeOptions, type OutcomeSeries } from './outcome-series';

// Small numeric helpers shared with callers that work on typed arrays
export { CompensatedAccumulator } from './compensated-sum';
export { selectInPlace } from './select-in-place';
export { roundTo } from './round-to';
