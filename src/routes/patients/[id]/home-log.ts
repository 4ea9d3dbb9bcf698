// The named loader and the arithmetic of the patient page's home-log timeline (HomeLogTimeline.svelte):
// the patient's home log (weekly adherence, own spasm ratings) and each visit's measured outcomes, on
// one time axis.
import type { Assessment, Observation, SelfReport } from '$lib/domain';
import { addDays, dayNumber, recordedWeeksOf, type RecordedWeek } from '$lib/programme';
import { outcomeSeries, type LocalMdc, type OutcomeSeries } from '$lib/stats';
import type { KinnoteStore } from '$lib/store';

/** One day's spasm rating by the patient: Penn frequency 0–4 and severity 0–10, either may be missing. */
export interface SpasmRating {
  readonly day: string;
  readonly penn: number | null;
  readonly severity: number | null;
}

export interface HomeLog {
  readonly weeks: readonly RecordedWeek[];
  readonly ratings: readonly SpasmRating[];
}

/** Reads the patient's weekly adherence and own spasm ratings (oldest first). */
export async function loadHomeLog(store: KinnoteStore, patientId: string): Promise<HomeLog> {
  const weeks = await recordedWeeksOf(store, patientId);
  const ratings = ((await store.selfReports.byPatient(patientId)) as SelfReport[])
    .filter((r) => r.spasmFrequencyPenn !== null || r.spasmSeverityNrs !== null)
    .map((r) => ({ day: r.reportedOn, penn: r.spasmFrequencyPenn, severity: r.spasmSeverityNrs }))
    .sort((a, b) => (a.day < b.day ? -1 : a.day > b.day ? 1 : 0));
  return { weeks, ratings };
}

/**
 * One visit's measured outcomes as the patient page judges them: how many of the measures taken that
 * day changed from baseline by at least the MDC (better or worse), stayed within it, or have no MDC.
 * `baseline` counts the measures for which the visit is (or comes before) the baseline: not judged.
 */
export interface VisitOutcome {
  readonly assessmentId: string;
  readonly day: string;
  readonly measures: number;
  readonly better: number;
  readonly worse: number;
  readonly within: number;
  readonly noMdc: number;
  readonly baseline: number;
}

/** The series the timeline judges by: the overview's default (baseline = first visit), the team's MDCs. */
export function timelineSeries(assessments: readonly Assessment[], observations: readonly Observation[], localMdc: readonly LocalMdc[]): OutcomeSeries[] {
  return outcomeSeries([...observations], { baselineRule: { kind: 'first' }, localMdc, assessorByAssessment: new Map(assessments.map((a) => [a.id, a.assessorId])) });
}

/** Each visit (oldest first) with the verdicts the series gave its points (series.judgements), counted. */
export function visitOutcomes(assessments: readonly Assessment[], series: readonly Pick<OutcomeSeries, 'points' | 'judgements'>[]): VisitOutcome[] {
  const tally = new Map<string, { measures: number; better: number; worse: number; within: number; noMdc: number; baseline: number }>();
  for (const a of assessments) tally.set(a.id, { measures: 0, better: 0, worse: 0, within: 0, noMdc: 0, baseline: 0 });
  for (const s of series) {
    s.points.forEach((point, i) => {
      const t = tally.get(point.assessmentId);
      if (!t) return;
      t.measures++;
      const judged = s.judgements[i] ?? null;
      if (judged === null) t.baseline++;
      else if (judged.verdict === 'improved') t.better++;
      else if (judged.verdict === 'worsened') t.worse++;
      else if (judged.verdict === 'no-change') t.within++;
      else t.noMdc++;
    });
  }
  return [...assessments]
    .sort((a, b) => (a.performedAt < b.performedAt ? -1 : a.performedAt > b.performedAt ? 1 : 0))
    .map((a) => ({ assessmentId: a.id, day: a.performedAt.slice(0, 10), ...tally.get(a.id)! }));
}

/** The shared axis, in day numbers: from the first to the last day of any visit, week or rating (at least a week). */
export function timelineRange(visitDays: readonly string[], log: HomeLog): { readonly from: number; readonly to: number } | null {
  const days = [...visitDays, ...log.weeks.flatMap((w) => [w.weekStart, addDays(w.weekStart, 6)]), ...log.ratings.map((r) => r.day)].sort();
  if (days.length === 0) return null;
  const from = dayNumber(days[0]!);
  return { from, to: Math.max(dayNumber(days.at(-1)!), from + 7) };
}

/** Where a day falls on the axis, in per cent of its width (kept 2 % from each edge for the marks). */
export function axisPercent(range: { readonly from: number; readonly to: number }, day: string): number {
  return 2 + (96 * (dayNumber(day) - range.from)) / (range.to - range.from);
}

/**
 * Rows for marks along one axis so that none overlaps another: each mark (its centre `at` and width,
 * in the same unit, in axis order) goes on the first row where it clears the previous mark by `gap`.
 * Row 0 is next to the axis. A phone at 200 % text needs a second or third row where visits are close.
 */
export function markRows(marks: readonly { readonly at: number; readonly width: number }[], gap: number): number[] {
  const rightEdges: number[] = [];
  return marks.map(({ at, width }) => {
    const left = at - width / 2;
    let row = rightEdges.findIndex((right) => left >= right + gap);
    if (row === -1) row = rightEdges.push(0) - 1;
    rightEdges[row] = at + width / 2;
    return row;
  });
}
