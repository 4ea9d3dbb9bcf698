import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { linearRegression, rSquared } from 'simple-statistics';
import { StatsInputError } from '../../../src/lib/stats';
import { mannKendall } from '../../../src/lib/stats/mann-kendall';
import { olsTrend } from '../../../src/lib/stats/ols-trend';
import { segmentedRegression } from '../../../src/lib/stats/segmented-regression';
import { theilSen, theilSenInto, theilSenScratchLength } from '../../../src/lib/stats/theil-sen';
import { relativeError } from '../../support/relative-error';
import { gaussian, mulberry32 as seededRng } from '../../support/seeded-random';

function seededSeries(seed: number, n: number): { t: Float64Array; y: Float64Array } {
  const rng = seededRng(seed);
  const t = new Float64Array(n);
  const y = new Float64Array(n);
  let day = 0;
  for (let i = 0; i < n; i++) {
    day += 3 + Math.floor(rng() * 20);
    t[i] = day;
    y[i] = 40 + 0.07 * day + 3 * gaussian(rng);
  }
  return { t, y };
}

describe('OLS trend', () => {
  it('agrees with simple-statistics 7.12.1 linearRegression and rSquared on seeded series', () => {
    for (let seed = 1; seed <= 30; seed++) {
      const { t, y } = seededSeries(seed, 5 + seed);
      const pairs = Array.from(t, (ti, i) => [ti, y[i] as number]);
      const reference = linearRegression(pairs);
      const trend = olsTrend(t, y);
      expect(relativeError(trend.slopePer30Days, reference.m * 30)).toBeLessThan(1e-10);
      expect(relativeError(trend.intercept, reference.b)).toBeLessThan(1e-10);
      const line = (x: number): number => reference.m * x + reference.b;
      expect(relativeError(trend.rSquared, rSquared(pairs, line))).toBeLessThan(1e-9);
    }
  });

  it('slope unchanged by shifting y or t, scales with y (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 10_000 }), fc.double({ min: -1e4, max: 1e4, noNaN: true }), fc.double({ min: 0.1, max: 100, noNaN: true }), (seed, shift, scale) => {
        const { t, y } = seededSeries(seed, 12);
        const base = olsTrend(t, y).slopePer30Days;
        expect(relativeError(olsTrend(t, y.map((v) => v + shift)).slopePer30Days, base)).toBeLessThan(1e-8);
        expect(relativeError(olsTrend(t.map((v) => v + 1000), y).slopePer30Days, base)).toBeLessThan(1e-8);
        expect(relativeError(olsTrend(t, y.map((v) => v * scale)).slopePer30Days, base * scale)).toBeLessThan(1e-10);
      }),
      { numRuns: 100, seed: 8 },
    );
  });

  it('interval contains the slope; exact line gives R² 1 and zero width', () => {
    const t = new Float64Array([0, 30, 60, 90]);
    const exact = olsTrend(t, t.map((v) => 2 + v / 10));
    expect(exact.slopePer30Days).toBeCloseTo(3, 12);
    expect(exact.rSquared).toBeCloseTo(1, 12);
    expect(exact.slopeCi95Per30Days[1] - exact.slopeCi95Per30Days[0]).toBeLessThan(1e-10);
    const noisy = olsTrend(...Object.values(seededSeries(4, 10)) as [Float64Array, Float64Array]);
    expect(noisy.slopeCi95Per30Days[0]).toBeLessThan(noisy.slopePer30Days);
    expect(noisy.slopeCi95Per30Days[1]).toBeGreaterThan(noisy.slopePer30Days);
  });

  it('edge cases: n = 0, 1, 2, constant values, NaN skipped, length mismatch', () => {
    expect(olsTrend(new Float64Array(0), new Float64Array(0)).slopePer30Days).toBeNaN();
    expect(olsTrend(new Float64Array([1]), new Float64Array([5])).slopePer30Days).toBeNaN();
    const two = olsTrend(new Float64Array([0, 30]), new Float64Array([1, 2]));
    expect(two.slopePer30Days).toBeCloseTo(1, 14);
    expect(two.slopeStandardErrorPer30Days).toBeNaN();
    expect(olsTrend(new Float64Array([0, 1, 2]), new Float64Array([4, 4, 4])).rSquared).toBeNaN();
    const withGap = olsTrend(new Float64Array([0, 30, 60, 90]), new Float64Array([1, Number.NaN, 3, 4]));
    expect(withGap.n).toBe(3);
    expect(() => olsTrend(new Float64Array(2), new Float64Array(3))).toThrow(StatsInputError);
  });
});

describe('Theil–Sen', () => {
  it('robust to one outlier where OLS is not', () => {
    const t = Float64Array.from({ length: 15 }, (_, i) => i * 10);
    const y = t.map((v) => 10 + v / 30);
    y[12] = 500;
    expect(theilSen(t, y).slopePer30Days).toBeCloseTo(1, 10);
    expect(Math.abs(olsTrend(t, y).slopePer30Days - 1)).toBeGreaterThan(0.5);
  });

  it('slope matches a sort-based median; invariant to point order (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 9 }), { minLength: 2, maxLength: 30 }), (ys) => {
        const n = ys.length;
        const t = Float64Array.from({ length: n }, (_, i) => i * 7);
        const y = Float64Array.from(ys);
        const slopes: number[] = [];
        for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) slopes.push(((y[j] as number) - (y[i] as number)) / ((t[j] as number) - (t[i] as number)));
        slopes.sort((a, b) => a - b);
        const m = slopes.length;
        const median = m % 2 ? (slopes[m >> 1] as number) : ((slopes[m / 2 - 1] as number) + (slopes[m / 2] as number)) / 2;
        const out = theilSenInto(t, y, new Float64Array(6), new Float64Array(theilSenScratchLength(n)));
        expect(out[2]).toBeCloseTo(median, 12);
        const reversed = theilSenInto(t.slice().reverse(), y.slice().reverse(), new Float64Array(6));
        expect(reversed[2]).toBeCloseTo(median, 12);
      }),
      { numRuns: 200, seed: 9 },
    );
  });

  it('edge cases: one point, equal times, short scratch', () => {
    expect(theilSen(new Float64Array([1]), new Float64Array([2])).slopePer30Days).toBeNaN();
    expect(theilSen(new Float64Array([5, 5, 5]), new Float64Array([1, 2, 3])).slopePer30Days).toBeNaN();
    expect(() => theilSenInto(new Float64Array(5), new Float64Array(5), new Float64Array(6), new Float64Array(3))).toThrow(/scratch/);
  });
});

describe('Mann–Kendall', () => {
  it('sign follows the trend; reversing values negates S', () => {
    const { t, y } = seededSeries(12, 20);
    const up = mannKendall(t, y);
    const down = mannKendall(t, y.map((v) => -v));
    expect(up.s).toBeGreaterThan(0);
    expect(down.s).toBe(-up.s);
    expect(down.p).toBeCloseTo(up.p, 14);
  });
  it('ties use the normal approximation with tie-corrected variance; all tied gives NaN p', () => {
    const t = new Float64Array([1, 2, 3, 4, 5, 6]);
    const mk = mannKendall(t, new Float64Array([1, 1, 2, 2, 3, 3]));
    expect(mk.method).toBe('normal-cc');
    expect(mk.variance).toBeCloseTo((6 * 5 * 17 - 3 * 2 * 1 * 9) / 18, 12);
    expect(mannKendall(t, new Float64Array(6).fill(2)).p).toBeNaN();
  });
  it('refuses times that are not strictly increasing', () => {
    expect(() => mannKendall(new Float64Array([1, 1, 2]), new Float64Array([1, 2, 3]))).toThrow(/strictly increasing/);
  });
});

describe('segmented regression', () => {
  it('recovers an exact level and slope change', () => {
    const t = Float64Array.from({ length: 12 }, (_, i) => i * 15);
    const event = 90;
    const y = t.map((v) => 10 + (v - event) / 30 + (v >= event ? -4 - (2 * (v - event)) / 30 : 0));
    const fit = segmentedRegression(t, y, event);
    expect(fit.levelAtEvent.estimate).toBeCloseTo(10, 10);
    expect(fit.slopeBeforePer30Days.estimate).toBeCloseTo(1, 10);
    expect(fit.levelChange.estimate).toBeCloseTo(-4, 10);
    expect(fit.slopeChangePer30Days.estimate).toBeCloseTo(-2, 10);
    expect(fit.residualSd).toBeLessThan(1e-9);
  });
  it('NaN when a side has fewer than two assessments', () => {
    const fit = segmentedRegression(new Float64Array([0, 10, 20, 30]), new Float64Array([1, 2, 3, 4]), 25);
    expect(fit.levelChange.estimate).toBeNaN();
    expect(() => segmentedRegression(new Float64Array(2), new Float64Array(2), Number.NaN)).toThrow(StatsInputError);
  });
});
