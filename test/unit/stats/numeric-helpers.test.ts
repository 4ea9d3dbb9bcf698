import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { selectInPlace } from '../../../src/lib/stats';
import { compensatedSum } from '../../../src/lib/stats/compensated-sum';
import { insertionSortRange } from '../../../src/lib/stats/insertion-sort-range';
import { roundHalfEven } from '../../../src/lib/stats/round-half-even';

describe('selectInPlace', () => {
  it('returns the k-th smallest and partitions around it (property, with duplicates)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -20, max: 20 }), { minLength: 1, maxLength: 300 }), fc.nat(), (values, kSeed) => {
        const array = Float64Array.from(values);
        const k = kSeed % values.length;
        const sorted = Array.from(values).sort((a, b) => a - b);
        const value = selectInPlace(array, k);
        expect(value).toBe(sorted[k]);
        for (let i = 0; i < k; i++) expect(array[i]).toBeLessThanOrEqual(value);
        for (let i = k + 1; i < array.length; i++) expect(array[i]).toBeGreaterThanOrEqual(value);
        expect(Array.from(array).sort((a, b) => a - b)).toEqual(sorted);
      }),
      { numRuns: 300, seed: 1 },
    );
  });
});

describe('insertionSortRange', () => {
  it('sorts only the range', () => {
    const array = new Float64Array([9, 5, 3, 4, 1, 0]);
    insertionSortRange(array, 1, 5);
    expect(Array.from(array)).toEqual([9, 1, 3, 4, 5, 0]);
  });
});

describe('compensatedSum', () => {
  it('keeps small terms next to large ones', () => {
    const values = [1e16, 1, -1e16, 1, 1e-3];
    expect(compensatedSum(values)).toBe(2.001);
    expect(compensatedSum(Float64Array.from({ length: 10 }, () => 0.1))).toBe(1);
  });
});

describe('roundHalfEven (numpy np.round semantics)', () => {
  it('ties go to the even integer', () => {
    expect([0.5, 1.5, 2.5, -0.5, -1.5, 2.4, 2.6, 3].map(roundHalfEven)).toEqual([0, 2, 2, -0, -2, 2, 3, 3]);
  });
});
