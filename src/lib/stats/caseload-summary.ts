import type { Observation } from '../domain';
import type { LocalMdc } from './choose-mdc';
import { latestVerdicts } from './outcome-series';

/** What the caseload needs of an assessment (a stored row, notes sealed or not, will do). */
export interface SummaryAssessment {
  readonly id: string;
  readonly patientId: string;
  readonly assessorId: string;
  readonly performedAt: string;
  readonly deleted: boolean;
}

/** One patient's line in the caseload, apart from the patient record itself and the due date. */
export interface CaseloadSummary {
  /** performedAt of the latest live assessment, Unix ms; null when there is none. */
  readonly lastAssessmentMs: number | null;
  /** Series whose latest value differs from the first assessment's by at least the MDC. */
  readonly improved: number;
  readonly worsened: number;
  /** Titles of the series that changed beyond their MDC, for the row's text. */
  readonly changedTitles: readonly string[];
}

/**
 * One patient's caseload summary: the last live assessment, and how many measures changed beyond
 * their MDC since the first assessment (improved and worsened counted apart), by the same rule and
 * inputs as the patient's own page (outcomeSeries with the first assessment as baseline, the team's
 * adopted local MDCs, each assessment's assessor for the rater design). Pass that patient's
 * assessments (tombstones included: an observation's assessor is still its assessor) and
 * observations (tombstones are skipped here). Cost: latestVerdicts (a sort and one verdict per
 * series), not the full outcomeSeries. Never throws.
 */
export function caseloadSummary(
  assessments: readonly SummaryAssessment[],
  observations: readonly Observation[],
  localMdc: readonly LocalMdc[],
): CaseloadSummary {
  let lastMs: number | null = null;
  const assessorByAssessment = new Map<string, string>();
  for (const a of assessments) {
    assessorByAssessment.set(a.id, a.assessorId);
    if (a.deleted) continue;
    const t = Date.parse(a.performedAt);
    if (lastMs === null || t > lastMs) lastMs = t;
  }
  // Only each series' latest verdict is needed: latestVerdicts runs outcomeSeries' own code without
  // the trends and earlier points' judgements (which made a long series' summary quadratic).
  const series = latestVerdicts(
    observations.filter((o) => !o.deleted),
    { baselineRule: { kind: 'first' }, localMdc, assessorByAssessment },
  );
  let improved = 0;
  let worsened = 0;
  const changedTitles: string[] = [];
  for (const s of series) {
    const verdict = s.verdict?.verdict;
    if (verdict === 'improved') improved++;
    else if (verdict === 'worsened') worsened++;
    else continue;
    changedTitles.push(s.title);
  }
  return { lastAssessmentMs: lastMs, improved, worsened, changedTitles };
}

/**
 * A key for the inputs every summary shares (today: the adopted local MDCs). A stored summary made
 * under another key is out of date. Deterministic: same list, same key.
 */
export function caseloadSummaryBasis(localMdc: readonly LocalMdc[]): string {
  return JSON.stringify(
    [...localMdc]
      .map((m) => [m.measureCode, m.siteCode, m.quantity ?? null, m.value, m.citation])
      .sort((a, b) => (JSON.stringify(a) < JSON.stringify(b) ? -1 : 1)),
  );
}
