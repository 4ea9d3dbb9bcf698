import { describe, expect, it } from 'vitest';
import recomputed from '../../fixtures/stats/scipy-recomputed.json';
import { olsTrend } from '../../../src/lib/stats/ols-trend';
import { quantileSorted } from '../../../src/lib/stats/quantile-sorted';
import { segmentedRegression } from '../../../src/lib/stats/segmented-regression';
import { standardisedResponseMean } from '../../../src/lib/stats/standardised-response-mean';
import { relativeError } from '../../support/relative-error';

describe(`OLS trend (RECOMPUTED: ${recomputed.ols.source})`, () => {
  const c = recomputed.ols;
  const trend = olsTrend(Float64Array.from(c.t), Float64Array.from(c.y));
  it('slope per 30 days, its 95 % interval, intercept, standard errors and R²', () => {
    expect(relativeError(trend.slopePer30Days, c.slope * 30)).toBeLessThan(1e-12);
    expect(relativeError(trend.slopeStandardErrorPer30Days, c.stderr * 30)).toBeLessThan(1e-10);
    expect(relativeError(trend.slopeCi95Per30Days[0], (c.slope - c.half) * 30)).toBeLessThan(1e-10);
    expect(relativeError(trend.slopeCi95Per30Days[1], (c.slope + c.half) * 30)).toBeLessThan(1e-10);
    expect(relativeError(trend.intercept, c.intercept)).toBeLessThan(1e-12);
    expect(relativeError(trend.interceptStandardError, c.interceptStderr)).toBeLessThan(1e-10);
    expect(relativeError(trend.rSquared, c.rSquared)).toBeLessThan(1e-12);
  });
});

describe(`segmented regression (RECOMPUTED: ${recomputed.segmented.source})`, () => {
  const c = recomputed.segmented;
  const fit = segmentedRegression(Float64Array.from(c.t), Float64Array.from(c.y), c.eventDay);
  const estimates = [fit.levelAtEvent, fit.slopeBeforePer30Days, fit.levelChange, fit.slopeChangePer30Days];
  it('level, slope, level change and slope change with standard errors and t intervals', () => {
    estimates.forEach((e, i) => {
      const beta = c.beta[i] as number;
      const se = c.se[i] as number;
      expect(relativeError(e.estimate, beta)).toBeLessThan(1e-10);
      expect(relativeError(e.standardError, se)).toBeLessThan(1e-10);
      expect(relativeError(e.ci95[0], beta - c.tcrit * se, 1e-12)).toBeLessThan(1e-9);
      expect(relativeError(e.ci95[1], beta + c.tcrit * se, 1e-12)).toBeLessThan(1e-9);
    });
    expect(relativeError(fit.residualSd, c.residualSd)).toBeLessThan(1e-10);
    expect(fit.nBefore + fit.nAfter).toBe(c.t.length);
  });
});

describe(`type 7 quantiles and the standardised response mean (RECOMPUTED: ${recomputed.quantiles.source})`, () => {
  const c = recomputed.quantiles;
  const sorted = Float64Array.from(c.x).sort();
  it('quantiles at 0, .1, .25, .5, .75, .9, 1', () => {
    c.p.forEach((p, i) => expect(relativeError(quantileSorted(sorted, p), c.expected[i] as number, 1e-12)).toBeLessThan(1e-13));
  });
  it('SRM = mean / SD (ddof 1)', () => {
    expect(relativeError(standardisedResponseMean(c.x), c.srm)).toBeLessThan(1e-12);
  });
});
