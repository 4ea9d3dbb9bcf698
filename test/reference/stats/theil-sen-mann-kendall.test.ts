import { describe, expect, it } from 'vitest';
import recomputed from '../../fixtures/stats/scipy-recomputed.json';
import { mannKendall } from '../../../src/lib/stats/mann-kendall';
import { theilSen, theilSenInto, theilSenSlots } from '../../../src/lib/stats/theil-sen';
import { relativeError } from '../../support/relative-error';

describe('Theil–Sen: example of Sen (1968)', () => {
  const x = new Float64Array([1, 2, 3, 4, 10, 12, 18]);
  const y = new Float64Array([9, 15, 19, 20, 45, 55, 78]);
  const out = theilSenInto(x, y, new Float64Array(6), undefined, 0.93);

  it('slope 4 and 93 % interval 3.71 to 4.38 (VERIFIED: scipy test_theilslopes, "example in Sen (1968)")', () => {
    expect(out[theilSenSlots.slopePerDay]).toBe(4);
    expect(out[theilSenSlots.lowerPerDay]).toBeCloseTo(3.71, 2);
    expect(out[theilSenSlots.upperPerDay]).toBeCloseTo(4.38, 2);
  });

  it(`exact order statistics 26/7 and 4.375, intercept 4 (RECOMPUTED: ${recomputed.senExample.source})`, () => {
    const [slope, lo, hi, intercept] = recomputed.senExample.expected as [number, number, number, number];
    expect(out[theilSenSlots.slopePerDay]).toBe(slope);
    expect(relativeError(out[theilSenSlots.lowerPerDay] as number, lo)).toBeLessThan(1e-15);
    expect(out[theilSenSlots.upperPerDay]).toBe(hi);
    expect(out[theilSenSlots.intercept]).toBe(intercept);
  });

  it('Kendall τ = 1 and exact two-sided p = 2/7! (REFERENCES.md §4a, RECOMPUTED)', () => {
    const mk = mannKendall(x, y);
    expect(mk.tau).toBe(1);
    expect(mk.method).toBe('exact');
    expect(relativeError(mk.p, 2 / 5040)).toBeLessThan(1e-14);
  });
});

describe(`seeded series against scipy (RECOMPUTED: ${recomputed.series.source})`, () => {
  recomputed.series.cases.forEach((c, index) => {
    const x = Float64Array.from(c.x);
    const y = Float64Array.from(c.y);
    it(`series ${index} (n = ${c.x.length}): Theil–Sen slope, 95 % interval and intercept`, () => {
      const ts = theilSen(x, y);
      const [slope, lo, hi, intercept] = c.theilSen as [number, number, number, number];
      expect(relativeError(ts.slopePer30Days / 30, slope, 1e-12)).toBeLessThan(1e-12);
      expect(relativeError(ts.slopeCiPer30Days[0] / 30, lo, 1e-12)).toBeLessThan(1e-12);
      expect(relativeError(ts.slopeCiPer30Days[1] / 30, hi, 1e-12)).toBeLessThan(1e-12);
      expect(relativeError(ts.intercept, intercept, 1e-12)).toBeLessThan(1e-12);
    });
    const reference = c.mannKendall;
    if (reference) {
      it(`series ${index}: Mann–Kendall τ and two-sided p (${reference.method})`, () => {
        const mk = mannKendall(x, y);
        expect(relativeError(mk.tau, reference.tau, 1e-12)).toBeLessThan(1e-12);
        expect(relativeError(mk.p, reference.p)).toBeLessThan(1e-9);
        expect(mk.method).toBe(reference.method.startsWith('kendalltau') ? 'exact' : 'normal-cc');
      });
    }
  });
});
