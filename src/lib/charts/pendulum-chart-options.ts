import type uPlot from 'uplot';
import { formatFixed } from '$lib/domain';
import { dampedCosineFitDeg, type DampedCosineParameters, type PendulumAnalysis } from '$lib/pendulum';
import { minMaxDecimate } from './min-max-decimate';
import * as t from './chart-messages';
import { chartColours, chartDashes, chartFontFamily } from './palette';

/** The fitted curve's parameters; drawn only when the fit converged and gives its phase. */
export type FittedCurve = DampedCosineParameters;

/** Seconds of the settled leg shown after rest onset. */
export const PENDULUM_REST_SHOWN_S = 1;

/** Columns for the pendulum chart: time from release (s), angle, and the fitted curve (or nulls). */
export function pendulumChartData(analysis: PendulumAnalysis, fit: FittedCurve | null, maxPoints = 1600): uPlot.AlignedData {
  const s = analysis.signals;
  const fs = s.sampleRateHz;
  // Half a second of the hold before release, the swing, and one second of rest once the leg has settled:
  // the rest plateau can run on for many seconds and would squeeze the swing into the left edge.
  const first = Math.max(0, Math.floor(s.releaseIndex - 0.5 * fs));
  const last = Math.min(s.angleDeg.length, Math.ceil(s.restEndIndex) + 1, Math.ceil(s.restOnsetIndex + PENDULUM_REST_SHOWN_S * fs) + 1);
  const kept = minMaxDecimate(s.angleDeg, first, last, Math.max(1, maxPoints >> 1));
  const n = kept.length;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  const fitted: (number | null)[] = new Array<number | null>(n);
  for (let j = 0; j < n; j++) {
    const i = kept[j] as number;
    const t = (i - s.releaseIndex) / fs;
    xs[j] = t;
    ys[j] = s.angleDeg[i] as number;
    fitted[j] = fit && t >= 0 ? dampedCosineFitDeg(fit, t) : null;
  }
  return [xs, ys, fitted];
}

function hatch(ctx: CanvasRenderingContext2D, ratio: number): CanvasPattern | string {
  const size = Math.round(8 * ratio);
  const tile = new OffscreenCanvas(size, size);
  const g = tile.getContext('2d');
  if (!g) return chartColours.extensionArea;
  g.fillStyle = chartColours.extensionArea;
  g.fillRect(0, 0, size, size);
  g.strokeStyle = 'rgba(179, 88, 6, 0.8)';
  g.lineWidth = ratio;
  g.beginPath();
  g.moveTo(0, size);
  g.lineTo(size, 0);
  g.stroke();
  return ctx.createPattern(tile, 'repeat') ?? chartColours.extensionArea;
}

/** Shades the area between the curve and the resting line: flexion side plain, extension side hatched. */
function drawAreas(u: uPlot, restDeg: number): void {
  const xs = u.data[0];
  const ys = u.data[1] as ArrayLike<number | null>;
  const ctx = u.ctx;
  const ratio = devicePixelRatio;
  const restY = u.valToPos(restDeg, 'y', true);
  const { left, top, width, height } = u.bbox;
  const path = new Path2D();
  let started = false;
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i] as number;
    const y = ys[i];
    if (x < 0 || y === null || y === undefined) continue;
    const px = u.valToPos(x, 'x', true);
    const py = u.valToPos(y, 'y', true);
    if (!started) {
      path.moveTo(px, restY);
      started = true;
    }
    path.lineTo(px, py);
  }
  if (!started) return;
  path.lineTo(u.valToPos(xs[xs.length - 1] as number, 'x', true), restY);
  path.closePath();
  ctx.save();
  ctx.beginPath();
  ctx.rect(left, top, width, restY - top);
  ctx.clip();
  ctx.fillStyle = chartColours.flexionArea;
  ctx.fill(path);
  ctx.restore();
  ctx.save();
  ctx.beginPath();
  ctx.rect(left, restY, width, top + height - restY);
  ctx.clip();
  ctx.fillStyle = hatch(ctx, ratio);
  ctx.fill(path);
  ctx.restore();
}

function horizontalLine(u: uPlot, value: number, colour: string, dash: readonly number[], label: string): void {
  const ctx = u.ctx;
  const ratio = devicePixelRatio;
  const y = u.valToPos(value, 'y', true);
  const { left, width } = u.bbox;
  ctx.save();
  ctx.strokeStyle = colour;
  ctx.fillStyle = colour;
  ctx.lineWidth = 1.5 * ratio;
  ctx.setLineDash(dash.map((d) => d * ratio));
  ctx.beginPath();
  ctx.moveTo(left, y);
  ctx.lineTo(left + width, y);
  ctx.stroke();
  ctx.font = `${12 * ratio}px ${chartFontFamily}`;
  ctx.textAlign = 'right';
  ctx.textBaseline = 'bottom';
  ctx.fillText(label, left + width - 4 * ratio, y - 2 * ratio);
  ctx.restore();
}

function drawMarkers(u: uPlot, analysis: PendulumAnalysis): void {
  const i = analysis.indices;
  const ctx = u.ctx;
  const ratio = devicePixelRatio;
  horizontalLine(u, i.restAngleDeg, chartColours.rest, [], t.restLine(formatFixed(i.restAngleDeg, 0)));
  horizontalLine(u, i.startAngleDeg, chartColours.event, chartDashes.event, t.startLine(formatFixed(i.startAngleDeg, 0)));
  // Release: a vertical line at t = 0.
  const x0 = u.valToPos(0, 'x', true);
  ctx.save();
  ctx.strokeStyle = chartColours.event;
  ctx.lineWidth = 1.5 * ratio;
  ctx.setLineDash(chartDashes.event.map((d) => d * ratio));
  ctx.beginPath();
  ctx.moveTo(x0, u.bbox.top);
  ctx.lineTo(x0, u.bbox.top + u.bbox.height);
  ctx.stroke();
  ctx.restore();
  // First flexion peak: a diamond with its angle.
  const px = u.valToPos(i.firstPeakTimeS, 'x', true);
  const py = u.valToPos(i.firstPeakDeg, 'y', true);
  const r = 7 * ratio;
  ctx.save();
  ctx.fillStyle = chartColours.value;
  ctx.strokeStyle = '#ffffff';
  ctx.lineWidth = 2 * ratio;
  ctx.beginPath();
  ctx.moveTo(px, py - r);
  ctx.lineTo(px + r, py);
  ctx.lineTo(px, py + r);
  ctx.lineTo(px - r, py);
  ctx.closePath();
  ctx.fill();
  ctx.stroke();
  // The label sits beside the diamond inside the plot: right of it, or left near the right edge; above
  // it, or below when the peak is near the top. It never reaches the axis labels or the canvas edge.
  ctx.fillStyle = chartColours.value;
  ctx.font = `600 ${12 * ratio}px ${chartFontFamily}`;
  ctx.textAlign = 'left';
  ctx.textBaseline = 'alphabetic';
  const text = t.firstPeak(formatFixed(i.firstPeakDeg, 0));
  const textWidth = ctx.measureText(text).width;
  const textHeight = 12 * ratio;
  const { left, top, width } = u.bbox;
  let tx = px + r + 3 * ratio;
  if (tx + textWidth > left + width) tx = px - r - 3 * ratio - textWidth;
  tx = Math.max(left + 2 * ratio, Math.min(tx, left + width - textWidth));
  const above = py - r - 2 * ratio;
  const ty = above - textHeight >= top ? above : py + r + 2 * ratio + textHeight;
  ctx.fillText(text, tx, ty);
  ctx.restore();
}

/** uPlot options for a pendulum trace with its events, side areas and fitted curve. */
export function pendulumChartOptions(analysis: PendulumAnalysis, width: number, height: number): uPlot.Options {
  return {
    width,
    height,
    legend: { show: true, live: false },
    cursor: { drag: { x: false, y: false } },
    scales: {
      x: { time: false },
      // Room above and below the swing for the peak's label and the line labels.
      y: {
        range: (_u, min, max) => {
          const pad = Math.max(3, (max - min) * 0.14);
          return [min - pad, max + pad];
        },
      },
    },
    axes: [
      {
        stroke: chartColours.axis,
        grid: { stroke: chartColours.grid },
        ticks: { stroke: chartColours.grid },
        values: (_u, splits) => splits.map((s) => `${Number(formatFixed(s, 3))} s`),
      },
      {
        stroke: chartColours.axis,
        grid: { stroke: chartColours.grid },
        ticks: { stroke: chartColours.grid },
        size: 52,
        values: (_u, splits) => splits.map((s) => `${formatFixed(s, 0)}°`),
      },
    ],
    series: [
      {},
      { label: t.kneeFlexionAngle, stroke: chartColours.value, width: 2, points: { show: false } },
      { label: t.fittedSwing, stroke: chartColours.fit, width: 2, dash: [...chartDashes.fit], points: { show: false } },
    ],
    hooks: {
      drawClear: [(u) => drawAreas(u, analysis.indices.restAngleDeg)],
      draw: [(u) => drawMarkers(u, analysis)],
    },
  };
}
