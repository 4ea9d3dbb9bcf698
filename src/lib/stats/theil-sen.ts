import { insertionSortRange } from './insertion-sort-range';
import { roundHalfEven } from './round-half-even';
import { normalQuantile } from './normal-distribution';
import { selectInPlace } from './select-in-place';
import { StatsInputError } from './stats-input-error';

const z975 = 1.959963984540054;

/** Theil–Sen trend of one series. Slopes are per 30 days. */
export interface TheilSen {
  /** Points used (NaN pairs skipped). */
  readonly n: number;
  /** Pairwise slopes with distinct times. */
  readonly pairCount: number;
  readonly slopePer30Days: number;
  /** Sen's (1968) distribution-free interval (95 % unless asked otherwise), as scipy.stats.theilslopes computes it. */
  readonly slopeCiPer30Days: readonly [number, number];
  /** median(values) − slope·median(times) (scipy's method='separate'), slope per day. */
  readonly intercept: number;
}

/** Slots of the `out` array filled by theilSenInto. */
export const theilSenSlots = { n: 0, pairCount: 1, slopePerDay: 2, lowerPerDay: 3, upperPerDay: 4, intercept: 5 } as const;

/** Scratch length theilSenInto needs for a series of `length` points. */
export function theilSenScratchLength(length: number): number {
  return (length * (length - 1)) / 2 + 2 * length;
}

// Σ t(t−1)(2t+5) over runs of equal values in sorted[from..to).
function tieTerm(sorted: Float64Array, from: number, to: number): number {
  let sum = 0;
  let run = 1;
  for (let i = from + 1; i <= to; i++) {
    if (i < to && sorted[i] === sorted[i - 1]) {
      run++;
    } else {
      if (run > 1) sum += run * (run - 1) * (2 * run + 5);
      run = 1;
    }
  }
  return sum;
}

function medianOfSortedRange(sorted: Float64Array, from: number, count: number): number {
  const mid = from + (count >> 1);
  return count % 2 === 1 ? (sorted[mid] as number) : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
}

/**
 * Theil–Sen slope (Theil 1950; Sen 1968): the median of the slopes (y_j − y_i)/(t_j − t_i) over
 * all pairs with distinct times, with Sen's interval from the normal approximation to Kendall's
 * S — order statistics R_u = round((N + z·σ)/2), R_l = round((N − z·σ)/2) − 1 (ties to even) of the
 * N sorted slopes, σ² = [n(n−1)(2n+5) − Σ_x t(t−1)(2t+5) − Σ_y t(t−1)(2t+5)]/18 — exactly as
 * scipy.stats.theilslopes (1.17) does, at `confidence` (95 % by default; scipy's alpha = 1 −
 * confidence). Writes into `out` (length ≥ 6, theilSenSlots).
 * `scratch` (length ≥ theilSenScratchLength(n)) is reused, so no allocation per series; the
 * slopes are partitioned by quickselect, not sorted. Cost O(n²) expected (times and values are
 * insertion-sorted, meant for series of at most a few hundred points).
 * Points with NaN are skipped; with fewer than 2 usable points or all times equal the slope,
 * interval and intercept are NaN. Interval ranks are clipped to the slopes available, as scipy does.
 * Throws StatsInputError when lengths differ, the scratch is too short or confidence is outside (0, 1).
 */
export function theilSenInto(
  timesDay: Float64Array,
  values: Float64Array,
  out: Float64Array,
  scratch: Float64Array = new Float64Array(theilSenScratchLength(timesDay.length)),
  confidence = 0.95,
): Float64Array {
  const length = timesDay.length;
  if (values.length !== length) throw new StatsInputError(`theilSen: ${length} times but ${values.length} values`);
  if (!(confidence > 0 && confidence < 1)) {
    throw new StatsInputError(`theilSen: confidence ${confidence} must lie strictly between 0 and 1`);
  }
  if (scratch.length < theilSenScratchLength(length)) {
    throw new StatsInputError(`theilSen: scratch of ${scratch.length} is shorter than ${theilSenScratchLength(length)}`);
  }
  let pairs = 0;
  let n = 0;
  for (let i = 0; i < length; i++) {
    const ti = timesDay[i] as number;
    const yi = values[i] as number;
    if (Number.isNaN(ti) || Number.isNaN(yi)) continue;
    n++;
    for (let j = i + 1; j < length; j++) {
      const dt = (timesDay[j] as number) - ti;
      const dy = (values[j] as number) - yi;
      // dt !== dt and dy !== dy catch NaN without a call.
      if (dt === 0 || dt !== dt || dy !== dy) continue;
      scratch[pairs++] = dy / dt;
    }
  }
  out[theilSenSlots.n] = n;
  out[theilSenSlots.pairCount] = pairs;
  if (pairs === 0) {
    out.fill(Number.NaN, theilSenSlots.slopePerDay, theilSenSlots.intercept + 1);
    return out;
  }
  // Sorted copies of the usable times and values, for the tie terms and the intercept.
  const timesAt = pairs;
  const valuesAt = pairs + n;
  let m = 0;
  for (let i = 0; i < length; i++) {
    const ti = timesDay[i] as number;
    const yi = values[i] as number;
    if (Number.isNaN(ti) || Number.isNaN(yi)) continue;
    scratch[timesAt + m] = ti;
    scratch[valuesAt + m] = yi;
    m++;
  }
  insertionSortRange(scratch, timesAt, timesAt + n);
  insertionSortRange(scratch, valuesAt, valuesAt + n);
  const sigma = Math.sqrt(
    (n * (n - 1) * (2 * n + 5) - tieTerm(scratch, timesAt, timesAt + n) - tieTerm(scratch, valuesAt, valuesAt + n)) / 18,
  );
  const z = confidence === 0.95 ? z975 : normalQuantile(0.5 + confidence / 2);
  const upperRank = Math.min(roundHalfEven((pairs + z * sigma) / 2), pairs - 1);
  const lowerRank = Math.max(roundHalfEven((pairs - z * sigma) / 2) - 1, 0);
  // Select the median first, then the bounds inside the halves it leaves partitioned; for an even
  // count the lower middle slope is simply the largest of the lower half.
  const mid = pairs >> 1;
  const upperMid = selectInPlace(scratch, mid, 0, pairs);
  let slope = upperMid;
  if (pairs % 2 === 0) {
    let lowerMid = scratch[0] as number;
    for (let i = 1; i < mid; i++) if ((scratch[i] as number) > lowerMid) lowerMid = scratch[i] as number;
    slope = (lowerMid + upperMid) / 2;
  }
  const lower = lowerRank <= mid ? selectInPlace(scratch, lowerRank, 0, mid + 1) : selectInPlace(scratch, lowerRank - mid, mid, pairs);
  const upper = upperRank >= mid ? selectInPlace(scratch, upperRank - mid, mid, pairs) : selectInPlace(scratch, upperRank, 0, mid + 1);
  out[theilSenSlots.slopePerDay] = slope;
  out[theilSenSlots.lowerPerDay] = lower;
  out[theilSenSlots.upperPerDay] = upper;
  out[theilSenSlots.intercept] = medianOfSortedRange(scratch, valuesAt, n) - slope * medianOfSortedRange(scratch, timesAt, n);
  return out;
}

/** Theil–Sen slope per 30 days with Sen's interval (95 % by default); the object form of theilSenInto. */
export function theilSen(timesDay: Float64Array, values: Float64Array, scratch?: Float64Array, confidence = 0.95): TheilSen {
  const out = theilSenInto(timesDay, values, new Float64Array(6), scratch, confidence);
  return {
    n: out[theilSenSlots.n] as number,
    pairCount: out[theilSenSlots.pairCount] as number,
    slopePer30Days: (out[theilSenSlots.slopePerDay] as number) * 30,
    slopeCiPer30Days: [(out[theilSenSlots.lowerPerDay] as number) * 30, (out[theilSenSlots.upperPerDay] as number) * 30],
    intercept: out[theilSenSlots.intercept] as number,
  };
}
