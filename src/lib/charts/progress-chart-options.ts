import type uPlot from 'uplot';
import { layoutEventLabels } from './event-label-layout';
import * as t from './chart-messages';
import { chartColours, chartDashes, chartFontFamily } from './palette';

/** What a progress chart shows: one measure at one site over time. Values of ordinal scales are ranks. */
export interface ProgressChartInput {
  readonly title: string;
  /** Unit shown on the axis, e.g. "°"; empty for grades. */
  readonly unitLabel: string;
  readonly timesMs: Float64Array;
  readonly values: Float64Array;
  /** For an ordinal scale: the label of each rank (index = rank). Draws an ordinal axis with equal steps. */
  readonly ordinalLabels?: readonly string[];
  readonly baseline?: number | null;
  /** Minimal detectable change, drawn as a band of ± mdc around the baseline. */
  readonly mdc?: number | null;
  readonly events?: ReadonlyArray<{ readonly timeMs: number; readonly label: string }>;
  /** Trend line: value = intercept + slopePerDay · (t − t0) in days. */
  readonly trend?: { readonly slopePerDay: number; readonly intercept: number; readonly t0Ms: number } | null;
  readonly validRange?: readonly [number, number];
}

const dayMs = 86_400_000;

/**
 * Builds uPlot data columns: x in seconds (uPlot's time unit), values, and the trend evaluated at each x.
 *
 * @example
 * const [xs, ys] = progressChartData({ title: 'Elbow flexors, MAS', unitLabel: '', timesMs: Float64Array.of(Date.UTC(2025, 0, 6)), values: Float64Array.of(3) });
 * xs[0]; // 1736121600 (seconds); ys[0]; // 3
 */
export function progressChartData(input: ProgressChartInput): uPlot.AlignedData {
  const n = input.timesMs.length;
  const xs = new Float64Array(n);
  const trend: (number | null)[] = new Array<number | null>(n);
  for (let i = 0; i < n; i++) {
    const t = input.timesMs[i] as number;
    xs[i] = t / 1000;
    trend[i] = input.trend ? input.trend.intercept + (input.trend.slopePerDay * (t - input.trend.t0Ms)) / dayMs : null;
  }
  return [xs, input.values, trend];
}

/** The y range: covers values, baseline ± MDC and trend, padded; an ordinal scale shows every grade. */
function progressYRange(input: ProgressChartInput): [number, number] {
  if (input.ordinalLabels) return [-0.5, input.ordinalLabels.length - 0.5];
  let lo = Infinity;
  let hi = -Infinity;
  const take = (v: number | null | undefined) => {
    if (v === null || v === undefined || !Number.isFinite(v)) return;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  };
  for (let i = 0; i < input.values.length; i++) take(input.values[i]);
  if (input.baseline !== null && input.baseline !== undefined && input.mdc) {
    take(input.baseline - input.mdc);
    take(input.baseline + input.mdc);
  }
  if (!Number.isFinite(lo)) return [0, 1];
  const pad = Math.max((hi - lo) * 0.12, 1);
  return [lo - pad, hi + pad];
}

function drawBandAndBaseline(u: uPlot, input: ProgressChartInput): void {
  const { baseline, mdc } = input;
  if (baseline === null || baseline === undefined) return;
  const ctx = u.ctx;
  const { left, width } = u.bbox;
  ctx.save();
  if (mdc && mdc > 0) {
    const top = u.valToPos(baseline + mdc, 'y', true);
    const bottom = u.valToPos(baseline - mdc, 'y', true);
    ctx.fillStyle = chartColours.band;
    ctx.fillRect(left, top, width, bottom - top);
    ctx.strokeStyle = chartColours.bandEdge;
    ctx.setLineDash(chartDashes.mdcEdge.map((d) => d * devicePixelRatio));
    ctx.lineWidth = devicePixelRatio;
    for (const y of [top, bottom]) {
      ctx.beginPath();
      ctx.moveTo(left, y);
      ctx.lineTo(left + width, y);
      ctx.stroke();
    }
  }
  const y = u.valToPos(baseline, 'y', true);
  ctx.strokeStyle = chartColours.baseline;
  ctx.lineWidth = 1.5 * devicePixelRatio;
  ctx.setLineDash(chartDashes.baseline.map((d) => d * devicePixelRatio));
  ctx.beginPath();
  ctx.moveTo(left, y);
  ctx.lineTo(left + width, y);
  ctx.stroke();
  ctx.restore();
}

const labelFontPx = 12;
const labelRowPx = 15;
const labelGapPx = 6;
/** A generous average glyph width of the label font, to reserve rows before the canvas can measure. */
const labelCharPx = 7.2;

/** Events inside the charted time range, sorted by time. */
function visibleEvents(input: ProgressChartInput): { timeMs: number; label: string }[] {
  const times = input.timesMs;
  if (times.length === 0) return [];
  const first = Math.min(...times);
  const last = Math.max(...times);
  return (input.events ?? []).filter((e) => e.timeMs >= first && e.timeMs <= last).sort((a, b) => a.timeMs - b.timeMs);
}

/** Rows of event labels the chart reserves above the plot, estimated from the label lengths. */
function estimatedLabelRows(input: ProgressChartInput, plotLeftPx: number, plotWidthPx: number): number {
  const events = visibleEvents(input);
  if (events.length === 0) return 0;
  const first = Math.min(...input.timesMs);
  const span = Math.max(1, Math.max(...input.timesMs) - first);
  const items = events.map((e) => ({ x: plotLeftPx + ((e.timeMs - first) / span) * plotWidthPx, width: e.label.length * labelCharPx }));
  return layoutEventLabels(items, plotLeftPx, plotLeftPx + plotWidthPx, labelGapPx).rows;
}

/** Event lines across the plot, their full labels in rows above it (never over the axis labels or each other). */
function drawEvents(u: uPlot, input: ProgressChartInput): void {
  const events = visibleEvents(input);
  if (events.length === 0) return;
  const ctx = u.ctx;
  const ratio = devicePixelRatio;
  const { top, height, left, width } = u.bbox;
  ctx.save();
  ctx.font = `${labelFontPx * ratio}px ${chartFontFamily}`;
  const items = events.map((e) => ({ x: u.valToPos(e.timeMs / 1000, 'x', true) / ratio, width: ctx.measureText(e.label).width / ratio }));
  const { placed } = layoutEventLabels(items, left / ratio, (left + width) / ratio, labelGapPx);
  ctx.strokeStyle = chartColours.event;
  ctx.fillStyle = chartColours.event;
  ctx.lineWidth = 1.5 * ratio;
  ctx.setLineDash(chartDashes.event.map((d) => d * ratio));
  // uPlot leaves its own alignment on the context (its axis labels are centred or right-aligned).
  ctx.textAlign = 'left';
  ctx.textBaseline = 'bottom';
  events.forEach((event, i) => {
    const x = (items[i] as { x: number }).x * ratio;
    const place = placed[i] as { left: number; row: number };
    const labelBottom = top - place.row * labelRowPx * ratio - 2 * ratio;
    ctx.beginPath();
    ctx.moveTo(x, labelBottom - labelFontPx * ratio);
    ctx.lineTo(x, top + height);
    ctx.stroke();
    ctx.fillText(event.label, place.left * ratio, labelBottom);
  });
  ctx.restore();
}

/** uPlot options for a progress chart of the given size. */
export function progressChartOptions(input: ProgressChartInput, width: number, height: number): uPlot.Options {
  const ordinal = input.ordinalLabels;
  const unit = input.unitLabel;
  const formatValue = (v: number) =>
    ordinal ? (ordinal[Math.round(v)] ?? '') : `${Number.isInteger(v) ? v : v.toFixed(1)}${unit}`;
  const yAxisPx = ordinal ? 44 : 50;
  const labelRows = estimatedLabelRows(input, yAxisPx, width - yAxisPx - 12);
  return {
    width,
    height: height + labelRows * labelRowPx,
    // The key is drawn by the component (it names the MDC band, which is no series).
    legend: { show: false },
    ...(labelRows > 0 ? { padding: [labelRows * labelRowPx + 8, null, null, null] as uPlot.Padding } : {}),
    cursor: { drag: { x: false, y: false }, points: { size: 10 } },
    scales: {
      x: { time: true },
      y: { range: () => progressYRange(input) },
    },
    axes: [
      { stroke: chartColours.axis, grid: { stroke: chartColours.grid }, ticks: { stroke: chartColours.grid }, space: 70 },
      {
        stroke: chartColours.axis,
        grid: { stroke: chartColours.grid },
        ticks: { stroke: chartColours.grid },
        size: yAxisPx,
        ...(ordinal
          ? {
              splits: () => ordinal.map((_, i) => i),
              values: (_u: uPlot, splits: number[]) => splits.map((s) => ordinal[s] ?? ''),
            }
          : { values: (_u: uPlot, splits: number[]) => splits.map((s) => formatValue(s)) }),
      },
    ],
    series: [
      {},
      {
        label: t.measured,
        stroke: chartColours.value,
        width: 2,
        points: { show: true, size: 9, fill: chartColours.valueFill, stroke: chartColours.value },
        value: (_u, v) => (v === null ? '–' : formatValue(v)),
      },
      {
        label: t.trend,
        stroke: chartColours.trend,
        width: 2,
        dash: [...chartDashes.trend],
        points: { show: false },
        value: (_u, v) => (v === null ? '–' : formatValue(v)),
      },
    ],
    hooks: {
      drawClear: [(u) => drawBandAndBaseline(u, input)],
      draw: [(u) => drawEvents(u, input)],
    },
  };
}
