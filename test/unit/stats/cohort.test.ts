import { describe, expect, it } from 'vitest';
import { quantileSorted as ssQuantileSorted, sampleStandardDeviation, mean } from 'simple-statistics';
import jStat from 'jstat';
import { cohortChangeSummary, StatsInputError } from '../../../src/lib/stats';
import { quantileSorted } from '../../../src/lib/stats/quantile-sorted';
import { standardisedResponseMean } from '../../../src/lib/stats/standardised-response-mean';
import { wilcoxonSignedRank } from '../../../src/lib/stats/wilcoxon-signed-rank';
import { relativeError } from '../../support/relative-error';
import { gaussian, mulberry32 as seededRng } from '../../support/seeded-random';

describe('cohortChangeSummary', () => {
  const rng = seededRng(77);
  const changes = Float64Array.from({ length: 200 }, () => Math.round((-3 + 4 * gaussian(rng)) * 10) / 10);

  it('median and quartiles are type 7 (checked against jstat 1.9.6 median and a direct interpolation)', () => {
    const summary = cohortChangeSummary(changes, 'lower', 5);
    const sorted = Array.from(changes).sort((a, b) => a - b);
    expect(summary.medianChange).toBe(jStat.median(Array.from(changes)));
    const h = (sorted.length - 1) * 0.25;
    const q1 = (sorted[Math.floor(h)] as number) + (h % 1) * ((sorted[Math.floor(h) + 1] as number) - (sorted[Math.floor(h)] as number));
    expect(summary.quartiles[0]).toBeCloseTo(q1, 12);
    expect(summary.iqr).toBeCloseTo(summary.quartiles[1] - summary.quartiles[0], 12);
  });

  it('proportion improved counts changes at least the MDC in the better direction, with a Wilson interval', () => {
    const summary = cohortChangeSummary(changes, 'lower', 5);
    const expected = Array.from(changes).filter((c) => -c >= 5).length;
    expect(summary.improvedBeyondMdc?.count).toBe(expected);
    const [lo, hi] = summary.improvedBeyondMdc?.wilson95 ?? [Number.NaN, Number.NaN];
    expect(lo).toBeLessThan(expected / 200);
    expect(hi).toBeGreaterThan(expected / 200);
    const higher = cohortChangeSummary(changes, 'higher', 5);
    expect(higher.improvedBeyondMdc?.count).toBe(Array.from(changes).filter((c) => c >= 5).length);
    expect(cohortChangeSummary(changes, 'lower', null).improvedBeyondMdc).toBeNull();
  });

  it('SRM agrees with simple-statistics 7.12.1 mean / sampleStandardDeviation', () => {
    const reference = mean(Array.from(changes)) / sampleStandardDeviation(Array.from(changes));
    expect(relativeError(cohortChangeSummary(changes, 'lower', 5).standardisedResponseMean, reference)).toBeLessThan(1e-12);
  });

  it('n = 0, n = 1, NaN skipped, bad MDC', () => {
    const empty = cohortChangeSummary([], 'lower', 1);
    expect(empty.n).toBe(0);
    expect(empty.medianChange).toBeNaN();
    expect(empty.improvedBeyondMdc?.proportion).toBeNaN();
    const one = cohortChangeSummary([Number.NaN, -2], 'lower', 1);
    expect(one.n).toBe(1);
    expect(one.medianChange).toBe(-2);
    expect(one.standardisedResponseMean).toBeNaN();
    expect(() => cohortChangeSummary([1], 'lower', 0)).toThrow(StatsInputError);
    expect(() => cohortChangeSummary([Number.POSITIVE_INFINITY], 'lower', 1)).toThrow(StatsInputError);
  });
});

describe('quantileSorted and SRM', () => {
  it('matches simple-statistics quantileSorted at the sample points it interpolates identically (p = 0, 0.5, 1)', () => {
    const sorted = [1, 2, 4, 8, 16];
    for (const p of [0, 0.5, 1]) expect(quantileSorted(sorted, p)).toBe(ssQuantileSorted(sorted, p));
    expect(quantileSorted(sorted, 0.3)).toBeCloseTo(2 + 0.2 * 2, 14);
    expect(quantileSorted([], 0.5)).toBeNaN();
    expect(quantileSorted(sorted, 1.2)).toBeNaN();
  });
  it('SRM of constant changes is NaN', () => {
    expect(standardisedResponseMean([2, 2, 2])).toBeNaN();
  });
});

describe('wilcoxonSignedRank edges', () => {
  it('zeros are dropped (Wilcoxon convention) and counted', () => {
    const result = wilcoxonSignedRank([0, 0, 1, 2, -3, 4]);
    expect(result.zerosDropped).toBe(2);
    expect(result.n).toBe(4);
    expect(result.wPlus).toBe(1 + 2 + 4);
  });
  it('all zeros give NaN p; exact refused with ties', () => {
    expect(wilcoxonSignedRank([0, 0]).p).toBeNaN();
    expect(() => wilcoxonSignedRank([1, 1, 2], 'exact')).toThrow(/exact method/);
  });
  it('exact and normal p converge for n = 50 untied (sanity, not a reference)', () => {
    const d = Array.from({ length: 50 }, (_, i) => (i % 3 === 0 ? -1 : 1) * (i + 1));
    const exact = wilcoxonSignedRank(d);
    const normal = wilcoxonSignedRank(d, 'normal-cc');
    expect(exact.method).toBe('exact');
    expect(Math.abs(exact.p - normal.p)).toBeLessThan(0.005);
  });
});
