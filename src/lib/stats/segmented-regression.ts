import { StatsInputError } from './stats-input-error';
import { tCritical95 } from './t-critical';

/** An estimate with its standard error and two-sided 95 % interval (Student t, n − 4 df). */
export interface SegmentEstimate {
  readonly estimate: number;
  readonly standardError: number;
  readonly ci95: readonly [number, number];
}

/** Segmented (interrupted time series) regression around one event. Slopes are per 30 days. */
export interface SegmentedRegression {
  readonly n: number;
  readonly nBefore: number;
  readonly nAfter: number;
  /** Fitted level just before the event (the pre-event line at the event time). */
  readonly levelAtEvent: SegmentEstimate;
  readonly slopeBeforePer30Days: SegmentEstimate;
  /** Jump at the event: post-event line minus pre-event line at the event time. */
  readonly levelChange: SegmentEstimate;
  /** Post-event slope minus pre-event slope. */
  readonly slopeChangePer30Days: SegmentEstimate;
  readonly residualSd: number;
}

// Solves the 4×4 symmetric positive-definite system in place by Gauss–Jordan with partial
// pivoting, returning the inverse in `inverse` (row-major); false when singular.
function invert4(matrix: Float64Array, inverse: Float64Array): boolean {
  const size = 4;
  inverse.fill(0);
  for (let i = 0; i < size; i++) inverse[i * size + i] = 1;
  for (let column = 0; column < size; column++) {
    let pivotRow = column;
    let best = Math.abs(matrix[column * size + column] as number);
    for (let row = column + 1; row < size; row++) {
      const candidate = Math.abs(matrix[row * size + column] as number);
      if (candidate > best) {
        best = candidate;
        pivotRow = row;
      }
    }
    if (!(best > 1e-12)) return false;
    if (pivotRow !== column) {
      for (let j = 0; j < size; j++) {
        let swap = matrix[column * size + j] as number;
        matrix[column * size + j] = matrix[pivotRow * size + j] as number;
        matrix[pivotRow * size + j] = swap;
        swap = inverse[column * size + j] as number;
        inverse[column * size + j] = inverse[pivotRow * size + j] as number;
        inverse[pivotRow * size + j] = swap;
      }
    }
    const pivot = matrix[column * size + column] as number;
    for (let j = 0; j < size; j++) {
      matrix[column * size + j] = (matrix[column * size + j] as number) / pivot;
      inverse[column * size + j] = (inverse[column * size + j] as number) / pivot;
    }
    for (let row = 0; row < size; row++) {
      if (row === column) continue;
      const factor = matrix[row * size + column] as number;
      if (factor === 0) continue;
      for (let j = 0; j < size; j++) {
        matrix[row * size + j] = (matrix[row * size + j] as number) - factor * (matrix[column * size + j] as number);
        inverse[row * size + j] = (inverse[row * size + j] as number) - factor * (inverse[column * size + j] as number);
      }
    }
  }
  return true;
}

/**
 * Segmented regression around an event at `eventDay` (Wagner et al. 2002, interrupted time series):
 * y = β0 + β1·u + β2·D + β3·u·D + ε with u = (t − eventDay)/30 (months of 30 days from the event)
 * and D = 1 for assessments at or after the event. β2 is the level change at the event, β3 the
 * slope change; standard errors from σ̂²·(XᵀX)⁻¹ with σ̂² = RSS/(n − 4), intervals from Student t
 * with n − 4 df. Centring time on the event keeps XᵀX well conditioned.
 * Points with NaN are skipped. Needs two distinct times on each side for the slopes; otherwise
 * (or with XᵀX singular) every estimate is NaN. With exactly 4 points the fit is exact and the
 * standard errors are NaN. Throws StatsInputError when lengths differ.
 */
export function segmentedRegression(timesDay: Float64Array, values: Float64Array, eventDay: number): SegmentedRegression {
  const length = timesDay.length;
  if (values.length !== length) throw new StatsInputError(`segmentedRegression: ${length} times but ${values.length} values`);
  if (!Number.isFinite(eventDay)) throw new StatsInputError(`segmentedRegression: event day ${eventDay} is not finite`);
  const xtx = new Float64Array(16);
  const xty = new Float64Array(4);
  const row = new Float64Array(4);
  let n = 0;
  let nAfter = 0;
  for (let i = 0; i < length; i++) {
    const t = timesDay[i] as number;
    const y = values[i] as number;
    if (Number.isNaN(t) || Number.isNaN(y)) continue;
    n++;
    const u = (t - eventDay) / 30;
    const after = t >= eventDay ? 1 : 0;
    nAfter += after;
    row[0] = 1;
    row[1] = u;
    row[2] = after;
    row[3] = u * after;
    for (let a = 0; a < 4; a++) {
      xty[a] = (xty[a] as number) + (row[a] as number) * y;
      for (let b = 0; b < 4; b++) xtx[a * 4 + b] = (xtx[a * 4 + b] as number) + (row[a] as number) * (row[b] as number);
    }
  }
  const nBefore = n - nAfter;
  const nan: SegmentEstimate = { estimate: Number.NaN, standardError: Number.NaN, ci95: [Number.NaN, Number.NaN] };
  const undefinedFit: SegmentedRegression = {
    n,
    nBefore,
    nAfter,
    levelAtEvent: nan,
    slopeBeforePer30Days: nan,
    levelChange: nan,
    slopeChangePer30Days: nan,
    residualSd: Number.NaN,
  };
  const inverse = new Float64Array(16);
  if (nBefore < 2 || nAfter < 2 || !invert4(xtx.slice(), inverse)) return undefinedFit;
  const beta = new Float64Array(4);
  for (let a = 0; a < 4; a++) {
    let sum = 0;
    for (let b = 0; b < 4; b++) sum += (inverse[a * 4 + b] as number) * (xty[b] as number);
    beta[a] = sum;
  }
  let rss = 0;
  for (let i = 0; i < length; i++) {
    const t = timesDay[i] as number;
    const y = values[i] as number;
    if (Number.isNaN(t) || Number.isNaN(y)) continue;
    const u = (t - eventDay) / 30;
    const after = t >= eventDay ? 1 : 0;
    const fitted = (beta[0] as number) + (beta[1] as number) * u + (beta[2] as number) * after + (beta[3] as number) * u * after;
    rss += (y - fitted) ** 2;
  }
  const df = n - 4;
  const sigma2 = df > 0 ? rss / df : Number.NaN;
  const tCrit = df > 0 ? tCritical95(df) : Number.NaN;
  const estimate = (index: number): SegmentEstimate => {
    const value = beta[index] as number;
    const se = Math.sqrt(sigma2 * (inverse[index * 4 + index] as number));
    return { estimate: value, standardError: se, ci95: [value - tCrit * se, value + tCrit * se] };
  };
  return {
    n,
    nBefore,
    nAfter,
    levelAtEvent: estimate(0),
    slopeBeforePer30Days: estimate(1),
    levelChange: estimate(2),
    slopeChangePer30Days: estimate(3),
    residualSd: Math.sqrt(sigma2),
  };
}
