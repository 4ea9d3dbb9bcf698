// Public face of src/lib/stats: other folders import only this file.
// Outcome statistics: distributions, reliability (ICC, SEM, MDC), change from baseline, trends and
// cohort summaries. Pure functions over plain data and Float64Array; no UI, storage or clock.
export { StatsInputError } from './stats-input-error';

// Distributions
export { normalCdf, normalQuantile } from './normal-distribution';
export { studentTCdf, studentTQuantile } from './student-t-distribution';
export { chiSquareCdf, chiSquareQuantile } from './chi-square-distribution';
export { fCdf, fQuantile } from './f-distribution';
export { regularizedBeta } from './incomplete-beta';
export { regularizedGamma } from './incomplete-gamma';
export { logGamma, logBeta } from './log-gamma';
export { tCritical95 } from './t-critical';

// Reliability
export { anovaMeanSquares, type AnovaMeanSquares } from './anova-mean-squares';
export { completeSubjects, MissingCellError, type ReliabilityTable } from './complete-subjects';
export {
  intraclassCorrelations,
  mcGrawWongNames,
  type IccEstimate,
  type IntraclassCorrelations,
} from './intraclass-correlations';
export { semFromMeanSquareError, semFromSdAndIcc, mdcFromSem } from './measurement-error';
export { parseCsvRecords, readReliabilityCsv, type CsvRecord } from './reliability-csv';

// Change
export { selectBaseline, type Baseline, type BaselineRule } from './select-baseline';
export {
  changeVerdict,
  type ChangeVerdict,
  type ChangeVerdictInput,
  type MdcProvenance,
  type MeasureScale,
  type OrdinalGrade,
  type VerdictKind,
} from './change-verdict';
export { reliableChangeIndex, type ReliableChange } from './reliable-change-index';

// Trends
export { olsTrend, olsTrendInto, olsSlots, type OlsTrend } from './ols-trend';
export { theilSen, theilSenInto, theilSenSlots, theilSenScratchLength, type TheilSen } from './theil-sen';
export { mannKendall, mannKendallInto, mannKendallScratchLength, type MannKendall } from './mann-kendall';
export { segmentedRegression, type SegmentedRegression, type SegmentEstimate } from './segmented-regression';

// Cohort summaries
export { quantileSorted } from './quantile-sorted';
export { wilsonInterval } from './wilson-interval';
export { wilcoxonSignedRank, type WilcoxonSignedRank } from './wilcoxon-signed-rank';
export { standardisedResponseMean } from './standardised-response-mean';
export { cohortChangeSummary, type CohortChangeSummary } from './cohort-change-summary';

// Series of one patient, ready for the patient page and its charts
export { chooseMdc, mdcSourceLine, ORDINAL_STEP_MDC, type ComparedObservation, type LocalMdc, type MdcChoice, type MdcQuestion } from './choose-mdc';
export { seriesKey } from './series-key';
export { adoptedLocalMdc, type AdoptableStudy } from './adopted-local-mdc';
export { caseloadSummary, caseloadSummaryBasis, type CaseloadSummary, type SummaryAssessment } from './caseload-summary';
export { latestVerdicts, outcomeSeries, seriesTitle, type OutcomeOptions, type OutcomePoint, type OutcomeSeries, type OutcomeTrend } from './outcome-series';

// Small numeric helpers shared with callers that work on typed arrays
export { CompensatedAccumulator, compensatedSum } from './compensated-sum';
export { selectInPlace } from './select-in-place';
export { insertionSortRange } from './insertion-sort-range';
export { roundHalfEven } from './round-half-even';
export { roundTo } from './round-to';
