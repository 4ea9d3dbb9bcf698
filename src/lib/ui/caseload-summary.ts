import type { Assessment, Observation, Patient } from '$lib/domain';
import { outcomeSeries, type LocalMdc } from '$lib/stats';

/** One caseload row. */
export interface CaseloadRow {
  readonly patient: Patient;
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
 * Builds caseload rows: last assessment, next assessment due (last + review interval) and whether
 * any measure has changed beyond its MDC since the first assessment (improved or worsened counted
 * apart). Cost: one pass over assessments and observations, plus outcomeSeries per patient.
 */
export function caseloadRows(
  patients: readonly Patient[],
  assessments: readonly Assessment[],
  observations: readonly Observation[],
  reviewIntervalDays = DEFAULT_REVIEW_INTERVAL_DAYS,
  localMdc: readonly LocalMdc[] = [],
): CaseloadRow[] {
  const last = new Map<string, number>();
  const assessorByAssessment = new Map<string, string>();
  for (const a of assessments) {
    assessorByAssessment.set(a.id, a.assessorId);
    if (a.deleted) continue;
    const t = Date.parse(a.performedAt);
    if (t > (last.get(a.patientId) ?? -Infinity)) last.set(a.patientId, t);
  }
  const byPatient = new Map<string, Observation[]>();
  for (const o of observations) {
    if (o.deleted) continue;
    const list = byPatient.get(o.patientId);
    if (list) list.push(o);
    else byPatient.set(o.patientId, [o]);
  }
  return patients
    .filter((p) => !p.deleted)
    .map((patient) => {
      // The same rule and inputs as the patient's own page (first assessment as baseline).
      const series = outcomeSeries(byPatient.get(patient.id) ?? [], { baselineRule: { kind: 'first' }, localMdc, assessorByAssessment });
      const changed = series.filter((s) => s.verdict?.verdict === 'improved' || s.verdict?.verdict === 'worsened');
      const lastMs = last.get(patient.id) ?? null;
      return {
        patient,
        lastAssessmentMs: lastMs,
        nextDueMs: lastMs === null || patient.status !== 'active' ? null : lastMs + reviewIntervalDays * dayMs,
        improved: changed.filter((s) => s.verdict?.verdict === 'improved').length,
        worsened: changed.filter((s) => s.verdict?.verdict === 'worsened').length,
        changedTitles: changed.map((s) => s.title),
      };
    });
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
    .sort((a, b) => (a.nextDueMs ?? Infinity) - (b.nextDueMs ?? Infinity) || a.patient.code.localeCompare(b.patient.code));
}
