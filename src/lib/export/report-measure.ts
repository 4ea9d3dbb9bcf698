import { EVENT_KIND_LABELS, type ClinicalEvent } from '../domain';
import type { OutcomeSeries } from '../stats';
import type { ReportChart, ReportMeasure } from './referral-report';
import { changeText, mdcNote, mdcValueText, valueText } from './report-value-text';

const dayMs = 86_400_000;

/** What reportMeasure needs beyond the series: the scope's anchor, the events to mark, the clock's days, the notes. */
export interface ReportMeasureContext {
  readonly scopeKind: 'since-event' | 'period';
  readonly anchor: ClinicalEvent | null;
  readonly anchorMs: number;
  /** Live events up to the report's last day, at 00:00 UTC. */
  readonly eventTimesMs: readonly number[];
  /** Calendar day of an instant in the report's time zone. */
  readonly dayOfMs: (ms: number) => string;
  /** The 1-based number of a note's text, adding it to the report's notes the first time. */
  readonly noteNumber: (text: string) => number;
}

/** The chart of one series: from the baseline (or, without one, the first point after the event) on. */
function reportChart(s: OutcomeSeries, anchorMs: number, eventTimesMs: readonly number[]): ReportChart {
  const firstShown = s.baseline ? Math.min(...s.baseline.indices) : s.points.findIndex((p) => p.timeMs >= anchorMs);
  const shown = s.points.slice(firstShown);
  const band = s.baseline && s.mdc && s.verdict ? { low: s.baseline.low - s.mdc.value, high: s.baseline.high + s.mdc.value } : null;
  const values = shown.map((p) => p.value);
  const yMin = Math.min(...values, ...(band ? [band.low] : []));
  const yMax = Math.max(...values, ...(band ? [band.high] : []));
  return {
    timesMs: shown.map((p) => p.timeMs),
    values,
    baselineIndices: s.baseline ? s.baseline.indices.map((i) => i - firstShown) : [],
    band,
    eventTimesMs: eventTimesMs.filter((t) => t >= shown[0]!.timeMs && t <= shown[shown.length - 1]!.timeMs + dayMs),
    yMin: s.ordinalLabels ? Math.max(0, yMin) : yMin,
    yMax: s.ordinalLabels ? Math.min(s.ordinalLabels.length - 1, yMax) : yMax,
    gradeLabels: s.ordinalLabels,
    unit: s.unitLabel,
  };
}

/**
 * Step 2 of referralReport: one series as a row of the report, with its verdict (from outcomeSeries)
 * or why it is not compared; null when it was not assessed at or after the anchor.
 */
export function reportMeasure(s: OutcomeSeries, context: ReportMeasureContext): ReportMeasure | null {
  if (!s.points.some((p) => p.timeMs >= context.anchorMs)) return null;
  const chart = reportChart(s, context.anchorMs, context.eventTimesMs);
  const baselineText = s.baseline
    ? s.baseline.low === s.baseline.high
      ? valueText(s, s.baseline.low)
      : `${valueText(s, s.baseline.low)}–${valueText(s, s.baseline.high)}`
    : null;
  const baselineDays = s.baseline ? s.baseline.indices.map((i) => context.dayOfMs(s.points[i]!.timeMs)) : [];
  const latestText = valueText(s, s.latest.value);
  const latestDay = context.dayOfMs(s.latest.timeMs);
  const v = s.verdict;
  if (v) {
    return {
      key: s.key,
      title: s.title,
      baselineText,
      baselineDays,
      latestText,
      latestDay,
      changeText: changeText(s, v.changeRange),
      mdcText: mdcValueText(s, v.mdcUsed),
      noteNumber: context.noteNumber(mdcNote(s, v.mdcUsed, s.mdcNote)),
      verdict: v.verdict,
      sentence: v.text,
      chart,
    };
  }
  // No verdict: no baseline before the event, or one assessment only in the period.
  const only = s.points.length === 1 || (s.baseline !== null && s.baseline.indices.includes(s.points.length - 1));
  return {
    key: s.key,
    title: s.title,
    // A single assessment is no baseline of anything: it is shown as the latest value only.
    baselineText: only ? null : baselineText,
    baselineDays: only ? [] : baselineDays,
    latestText,
    latestDay,
    // A measure with no better direction still shows its change, unjudged.
    changeText: s.baseline && !only ? changeText(s, [s.latest.value - s.baseline.high, s.latest.value - s.baseline.low]) : '–',
    mdcText: '–',
    noteNumber: null,
    verdict: 'not-compared',
    sentence:
      context.scopeKind === 'since-event' && !s.baseline
        ? `No assessment before the ${EVENT_KIND_LABELS[context.anchor!.kind].toLowerCase()} to compare with; latest ${latestText}.`
        : only
          ? `Assessed once in this period (${latestText}); nothing to compare with.`
          : 'No direction of improvement for this measure: the change is shown, not judged.',
    chart,
  };
}
