import { mannKendall, type MannKendall } from './mann-kendall';
import { olsTrend } from './ols-trend';
import type { OutcomeTrend } from './outcome-series';
import { theilSen } from './theil-sen';

/**
 * The trend step of outcomeSeries: least squares per 30 days for continuous measures, Theil–Sen with
 * Mann–Kendall for ordinal grades (tied times, two assessments at one instant, give no Mann–Kendall
 * test). Null below 3 points or when every point has the same time. `timesDay` are days from `t0Ms`.
 */
export function seriesTrend(timesDay: Float64Array, values: Float64Array, t0Ms: number, ordinal: boolean): OutcomeTrend | null {
  if (timesDay.length < 3 || !(timesDay[timesDay.length - 1]! > timesDay[0]!)) return null;
  if (ordinal) {
    const ts = theilSen(timesDay, values);
    let mk: MannKendall | null;
    try {
      mk = mannKendall(timesDay, values);
    } catch {
      mk = null; // tied times (two assessments at the same instant): no trend test
    }
    return {
      method: 'theil-sen',
      slopePer30Days: ts.slopePer30Days,
      slopeCi95Per30Days: ts.slopeCiPer30Days,
      intercept: ts.intercept,
      t0Ms,
      slopePerDay: ts.slopePer30Days / 30,
      rSquared: null,
      mannKendall: mk,
    };
  }
  const ols = olsTrend(timesDay, values);
  return {
    method: 'least-squares',
    slopePer30Days: ols.slopePer30Days,
    slopeCi95Per30Days: ols.slopeCi95Per30Days,
    intercept: ols.intercept,
    t0Ms,
    slopePerDay: ols.slopePer30Days / 30,
    rSquared: ols.rSquared,
    mannKendall: null,
  };
}
