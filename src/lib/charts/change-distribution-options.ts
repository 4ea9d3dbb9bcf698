import uPlot from 'uplot';
import * as t from './chart-messages';
import { chartColours, chartDashes, chartFontFamily } from './palette';

/** Histogram of changes (follow-up − baseline) with the MDC thresholds and zero drawn as lines. */
export interface ChangeDistributionInput {
  readonly changes: Float64Array;
  readonly mdc: number | null;
  readonly unitLabel: string;
  /** Whole grade steps for ordinal measures: one bin per step. */
  readonly integerSteps: boolean;
}

/** Bin centres and counts: one bin per step for grades, else about √n bins (common practice). */
export function changeHistogram(input: ChangeDistributionInput): { centres: Float64Array; counts: Float64Array; width: number } {
  const values = Array.from(input.changes).filter(Number.isFinite);
  if (values.length === 0) return { centres: new Float64Array(0), counts: new Float64Array(0), width: 1 };
  let lo = Math.min(...values);
  let hi = Math.max(...values);
  if (input.mdc) {
    lo = Math.min(lo, -input.mdc);
    hi = Math.max(hi, input.mdc);
  }
  let width: number;
  if (input.integerSteps) {
    width = 1;
    lo = Math.floor(lo) - 0.5;
    hi = Math.ceil(hi) + 0.5;
  } else {
    const bins = Math.max(5, Math.min(30, Math.ceil(Math.sqrt(values.length)) + 2));
    width = (hi - lo || 1) / bins;
    lo -= width / 2;
    hi += width / 2;
  }
  const count = Math.max(1, Math.round((hi - lo) / width));
  const centres = new Float64Array(count);
  const counts = new Float64Array(count);
  for (let i = 0; i < count; i++) centres[i] = lo + (i + 0.5) * width;
  for (const v of values) counts[Math.min(count - 1, Math.max(0, Math.floor((v - lo) / width)))]! += 1;
  return { centres, counts, width };
}

/** Whole numbers inside a range, thinned to at most about 12 ticks. */
function wholeSteps([lo, hi]: readonly [number, number]): number[] {
  const first = Math.ceil(lo);
  const last = Math.floor(hi);
  const every = Math.max(1, Math.ceil((last - first + 1) / 12));
  const out: number[] = [];
  for (let v = first; v <= last; v += every) out.push(v);
  return out;
}

export function changeDistributionOptions(input: ChangeDistributionInput, width: number, height: number): uPlot.Options {
  const bars = uPlot.paths.bars?.({ size: [0.9, 60] });
  // The x range is the bins' own (uPlot's automatic range goes astray for a single bin).
  const { centres, width: binWidth } = changeHistogram(input);
  const xRange: [number, number] =
    centres.length === 0 ? [-1, 1] : [(centres[0] as number) - binWidth / 2, (centres[centres.length - 1] as number) + binWidth / 2];
  return {
    width,
    height,
    legend: { show: false },
    cursor: { drag: { x: false, y: false } },
    scales: { x: { time: false, range: () => xRange }, y: { range: (_u, _min, max) => [0, Math.max(1, max) * 1.15] } },
    axes: [
      {
        stroke: chartColours.axis,
        grid: { stroke: chartColours.grid },
        // Whole-grade changes get whole-grade ticks only (a half step is no change a grade can make).
        ...(input.integerSteps ? { splits: () => wholeSteps(xRange) } : {}),
        values: (_u, splits) => splits.map((s) => `${+s.toFixed(2)}${input.unitLabel}`),
      },
      { stroke: chartColours.axis, grid: { stroke: chartColours.grid }, size: 40, values: (_u, splits) => splits.map((s) => (Number.isInteger(s) ? String(s) : '')) },
    ],
    series: [{}, { label: t.patients, stroke: chartColours.value, fill: chartColours.band, width: 1.5, ...(bars ? { paths: bars } : {}), points: { show: false } }],
    hooks: {
      draw: [
        (u) => {
          const ctx = u.ctx;
          const ratio = devicePixelRatio;
          const { top, height: h } = u.bbox;
          const line = (value: number, colour: string, dash: readonly number[], label: string) => {
            const x = u.valToPos(value, 'x', true);
            ctx.save();
            ctx.strokeStyle = colour;
            ctx.fillStyle = colour;
            ctx.lineWidth = 2 * ratio;
            ctx.setLineDash(dash.map((d) => d * ratio));
            ctx.beginPath();
            ctx.moveTo(x, top);
            ctx.lineTo(x, top + h);
            ctx.stroke();
            ctx.font = `${12 * ratio}px ${chartFontFamily}`;
            ctx.textBaseline = 'top';
            ctx.fillText(label, x + 3 * ratio, top + 2 * ratio);
            ctx.restore();
          };
          line(0, chartColours.baseline, [], '0');
          if (input.mdc) {
            line(-input.mdc, chartColours.event, chartDashes.event, `−MDC`);
            line(input.mdc, chartColours.event, chartDashes.event, `+MDC`);
          }
        },
      ],
    },
  };
}
