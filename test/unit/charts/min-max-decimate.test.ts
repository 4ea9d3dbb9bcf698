import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { minMaxDecimate } from '../../../src/lib/charts/min-max-decimate';

describe('minMaxDecimate', () => {
  it('keeps every sample when there are few', () => {
    expect(Array.from(minMaxDecimate(new Float64Array([3, 1, 2]), 0, 3, 10))).toEqual([0, 1, 2]);
  });

  it('keeps the extremes of each bucket in time order, so no peak is lost (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 50, maxLength: 400 }),
        fc.integer({ min: 2, max: 20 }),
        (list, buckets) => {
          const values = Float64Array.from(list);
          const kept = minMaxDecimate(values, 0, values.length, buckets);
          expect(kept.length).toBeLessThanOrEqual(2 * buckets);
          for (let i = 1; i < kept.length; i++) expect(kept[i]).toBeGreaterThan(kept[i - 1] as number);
          const keptValues = Array.from(kept, (i) => values[i] as number);
          expect(Math.max(...keptValues)).toBe(Math.max(...list));
          expect(Math.min(...keptValues)).toBe(Math.min(...list));
        },
      ),
      { seed: 7, numRuns: 200 },
    );
  });
});
