import { describe, expect, it } from 'vitest';
import recomputed from '../../fixtures/stats/scipy-recomputed.json';
import { wilsonInterval } from '../../../src/lib/stats/wilson-interval';
import { relativeError } from '../../support/relative-error';

describe('Wilson score interval', () => {
  // Newcombe RG (1998a), Statistics in Medicine 17:857–872, Table I, method 3 (VERIFIED, 4 dp).
  const newcombe: { r: number; n: number; expected: [number, number] }[] = [
    { r: 81, n: 263, expected: [0.2553, 0.3662] },
    { r: 15, n: 148, expected: [0.0624, 0.1605] },
    { r: 0, n: 20, expected: [0.0, 0.1611] },
    { r: 1, n: 29, expected: [0.0061, 0.1718] },
  ];
  for (const c of newcombe) {
    it(`${c.r}/${c.n} → ${c.expected.join('–')} (Newcombe 1998a Table I, method 3)`, () => {
      const [lo, hi] = wilsonInterval(c.r, c.n);
      expect(Math.abs(lo - c.expected[0])).toBeLessThanOrEqual(0.00005 + 1e-12);
      expect(Math.abs(hi - c.expected[1])).toBeLessThanOrEqual(0.00005 + 1e-12);
    });
  }

  it(`full precision (RECOMPUTED: ${recomputed.wilson.source})`, () => {
    for (const c of recomputed.wilson.cases) {
      const [lo, hi] = wilsonInterval(c.r, c.n);
      const [elo, ehi] = c.expected as [number, number];
      expect(elo === 0 ? Math.abs(lo) : relativeError(lo, elo)).toBeLessThan(1e-12);
      expect(relativeError(hi, ehi)).toBeLessThan(1e-12);
    }
  });

  it('refuses non-counts and gives NaN for n = 0', () => {
    expect(() => wilsonInterval(3, 2)).toThrow(/not a count/);
    expect(() => wilsonInterval(1.5, 4)).toThrow(/not a count/);
    expect(wilsonInterval(0, 0).every(Number.isNaN)).toBe(true);
  });
});
