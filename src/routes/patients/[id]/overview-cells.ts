// What the patient overview shows of each outcome series: cells, group marks, chart input and plain sentences.
import type { ProgressChartInput } from '$lib/charts';
import { EVENT_KIND_LABELS, type ClinicalEvent } from '$lib/domain';
import type { OutcomeSeries } from '$lib/stats';
import { type OverviewGroup, PATIENT_PAGE_MESSAGES as m } from '$lib/ui';

export interface OverviewCell {
  readonly text: string;
  /** The verdict mark when the visit's change from baseline reaches the MDC. */
  readonly beyond: 'improved' | 'worsened' | null;
}

/** Each visit's value of a series, by assessment id. */
export function cellsOf(s: OutcomeSeries): Map<string, OverviewCell> {
  const out = new Map<string, OverviewCell>();
  s.points.forEach((p, i) => {
    const v = s.judgements[i]?.verdict;
    const text = s.measure.kind === 'tardieu' ? `${p.value}°` : p.text;
    out.set(p.assessmentId, { text, beyond: v === 'improved' || v === 'worsened' ? v : null });
  });
  return out;
}

/** How many of a folded group's rows reach the MDC at one visit, each way. */
export function groupMarks(g: OverviewGroup<OutcomeSeries>, assessmentId: string): { improved: number; worsened: number } {
  let improved = 0;
  let worsened = 0;
  for (const r of g.rows) {
    const beyond = cellsOf(r.series).get(assessmentId)?.beyond;
    if (beyond === 'improved') improved++;
    else if (beyond === 'worsened') worsened++;
  }
  return { improved, worsened };
}

/** Visits that hold a measurement, latest first (the overview's columns). */
export function overviewVisits(series: readonly OutcomeSeries[]): Array<{ id: string; timeMs: number }> {
  const seen = new Map<string, number>();
  for (const s of series) for (const p of s.points) if (!seen.has(p.assessmentId)) seen.set(p.assessmentId, p.timeMs);
  return [...seen].map(([id, timeMs]) => ({ id, timeMs })).sort((a, b) => b.timeMs - a.timeMs);
}

export function chartInput(s: OutcomeSeries, events: readonly ClinicalEvent[]): ProgressChartInput {
  return {
    title: `${s.title}${s.measure.kind === 'tardieu' ? m.tardieuChartTitle : ''}`,
    unitLabel: s.unitLabel,
    timesMs: Float64Array.from(s.points, (p) => p.timeMs),
    values: Float64Array.from(s.points, (p) => p.value),
    ...(s.ordinalLabels ? { ordinalLabels: s.ordinalLabels } : {}),
    baseline: s.baseline ? (s.baseline.low + s.baseline.high) / 2 : null,
    mdc: s.mdc?.value ?? null,
    events: events.filter((e) => !e.deleted).map((e) => ({ timeMs: Date.parse(`${e.occurredOn}T12:00:00Z`), label: EVENT_KIND_LABELS[e.kind] })),
    trend: s.trend ? { slopePerDay: s.trend.slopePerDay, intercept: s.trend.intercept, t0Ms: s.trend.t0Ms } : null,
  };
}

export function baselineText(s: OutcomeSeries): string {
  if (!s.baseline) return '–';
  const label = (v: number) => (s.ordinalLabels ? (s.ordinalLabels[v] ?? String(v)) : `${+v.toFixed(2)}${s.unitLabel}`);
  return s.baseline.low === s.baseline.high ? label(s.baseline.low) : `${label(s.baseline.low)}–${label(s.baseline.high)}`;
}

export function trendText(s: OutcomeSeries): string {
  if (!s.trend) return m.trendNeedsThree;
  if (s.trend.slopePer30Days === 0 && s.trend.method === 'theil-sen') return m.trendFlatGrades;
  const per = s.ordinalLabels ? m.gradeSteps : s.unitLabel;
  const method = s.trend.method === 'theil-sen' ? m.theilSen : m.leastSquares;
  const sign = s.trend.slopePer30Days > 0 ? '+' : '';
  return m.trend(method, `${sign}${s.trend.slopePer30Days.toFixed(2)}`, per);
}
