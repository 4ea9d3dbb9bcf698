import type { ReportChart } from './referral-report';

export interface ChartBox {
  readonly widthPx: number;
  readonly heightPx: number;
  /** Space kept free on every side, so dots and lines are not cut at the edge. */
  readonly padPx: number;
}

/** Where a report chart's marks go in a box whose origin is the top left corner (SVG coordinates). */
export interface ChartGeometry {
  /** "x,y x,y …" for an SVG polyline through the points in time order. */
  readonly line: string;
  readonly dots: readonly { readonly x: number; readonly y: number; readonly baseline: boolean }[];
  /** The baseline ± MDC band as a rectangle spanning the width; null without one. */
  readonly band: { readonly y: number; readonly height: number } | null;
  readonly eventXs: readonly number[];
  /** Labels of the top and bottom of the value axis (grade labels for a graded scale). */
  readonly topLabel: string;
  readonly bottomLabel: string;
}

/** The box of a report chart (both the page's SVG and the PDF draw in it) and the room at its left for the value labels ("178.5°", "1+"). */
export const REPORT_CHART_BOX: ChartBox = { widthPx: 150, heightPx: 44, padPx: 6 };
export const REPORT_CHART_AXIS_PX = 34;

const round = (value: number) => Math.round(value * 100) / 100;

/**
 * Places a report chart in a box: time runs left to right from the first to the last point, the value
 * from yMax at the top to yMin at the bottom, both linear. A chart with one point (or all points at
 * one time) puts it in the middle of the width; a flat value range puts the values in the middle of the
 * height. Events outside the time span are left out. Coordinates are rounded to 0.01 px.
 * Throws RangeError when the box leaves no room inside its padding or the chart has no point.
 */
export function reportChartGeometry(chart: ReportChart, box: ChartBox): ChartGeometry {
  const innerW = box.widthPx - 2 * box.padPx;
  const innerH = box.heightPx - 2 * box.padPx;
  if (!(innerW > 0) || !(innerH > 0)) throw new RangeError(`reportChartGeometry: a ${box.widthPx}×${box.heightPx} px box with ${box.padPx} px padding leaves no room`);
  if (chart.timesMs.length === 0) throw new RangeError('reportChartGeometry: the chart has no point');
  const t0 = chart.timesMs[0]!;
  const span = chart.timesMs[chart.timesMs.length - 1]! - t0;
  const range = chart.yMax - chart.yMin;
  const x = (t: number) => round(span > 0 ? box.padPx + ((t - t0) / span) * innerW : box.padPx + innerW / 2);
  const y = (v: number) => round(range > 0 ? box.padPx + ((chart.yMax - v) / range) * innerH : box.padPx + innerH / 2);
  const dots = chart.timesMs.map((t, i) => ({ x: x(t), y: y(chart.values[i]!), baseline: chart.baselineIndices.includes(i) }));
  let band: ChartGeometry['band'] = null;
  if (chart.band) {
    const top = y(Math.min(chart.band.high, chart.yMax));
    const bottom = y(Math.max(chart.band.low, chart.yMin));
    band = { y: top, height: round(bottom - top) };
  }
  const label = (v: number) => (chart.gradeLabels ? (chart.gradeLabels[Math.round(v)] ?? String(v)) : `${+v.toFixed(2)}${chart.unit}`);
  return {
    line: dots.map((d) => `${d.x},${d.y}`).join(' '),
    dots,
    band,
    eventXs: span > 0 ? chart.eventTimesMs.filter((t) => t >= t0 && t <= t0 + span).map(x) : [],
    topLabel: label(chart.yMax),
    bottomLabel: label(chart.yMin),
  };
}
