import type { Patient } from '$lib/domain';
import type { CaseloadPatient, CaseloadSummaryRow } from '$lib/store';

/** One caseload row. */
export interface CaseloadRow {
  readonly patient: CaseloadPatient;
  readonly lastAssessmentMs: number | null;
  readonly nextDueMs: number | null;
  /** Series whose latest value differs from baseline by at least the MDC. */
  readonly improved: number;
  readonly worsened: number;
  /** Titles of the series that changed beyond their MDC, for the row's text. */
  readonly changedTitles: readonly string[];
}

/** Review interval when nothing else is known: six weeks (a team choice, common practice). */
export const DEFAULT_REVIEW_INTERVAL_DAYS = 42;
const dayMs = 86_400_000;

/**
 * Caseload rows from the stored per-patient summaries (store.caseload(): last assessment and
 * changes beyond MDC since the first assessment, by the patient page's own rule), with the next
 * assessment due (last + review interval) for active patients. Cost O(patients).
 */
export function caseloadRows(summaries: readonly CaseloadSummaryRow[], reviewIntervalDays = DEFAULT_REVIEW_INTERVAL_DAYS): CaseloadRow[] {
  return summaries
    .filter((s) => !s.patient.deleted)
    .map((s) => ({
      patient: s.patient,
      lastAssessmentMs: s.lastAssessmentMs,
      nextDueMs: s.lastAssessmentMs === null || s.patient.status !== 'active' ? null : s.lastAssessmentMs + reviewIntervalDays * dayMs,
      improved: s.improved,
      worsened: s.worsened,
      changedTitles: s.changedTitles,
    }));
}

/**
 * Codes are ASCII (the patient code pattern: letters, digits and a hyphen), so code-unit order is their order; it is
 * also many times cheaper than localeCompare on a caseload of thousands.
 */
function byCode(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

export type CaseloadFilter = 'all' | 'due' | 'changed' | 'worsened';

/** Rows matching a search text (code or unlocked first name) and a filter, soonest due first. */
export function filterCaseload(
  rows: readonly CaseloadRow[],
  query: string,
  filter: CaseloadFilter,
  nowMs: number,
  names: ReadonlyMap<string, string>,
  status: Patient['status'] | 'any' = 'active',
): CaseloadRow[] {
  const q = query.trim().toLowerCase();
  return rows
    .filter((r) => status === 'any' || r.patient.status === status)
    .filter((r) => {
      if (q === '') return true;
      return r.patient.code.toLowerCase().includes(q) || (names.get(r.patient.id) ?? '').toLowerCase().includes(q);
    })
    .filter((r) => {
      switch (filter) {
        case 'due':
          return r.nextDueMs !== null && r.nextDueMs <= nowMs + 7 * dayMs;
        case 'changed':
          return r.improved + r.worsened > 0;
        case 'worsened':
          return r.worsened > 0;
        default:
          return true;
      }
    })
    .sort((a, b) => (a.nextDueMs ?? Infinity) - (b.nextDueMs ?? Infinity) || byCode(a.patient.code, b.patient.code));
}
