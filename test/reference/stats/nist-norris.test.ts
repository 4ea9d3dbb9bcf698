import { describe, expect, it } from 'vitest';
import { olsTrendInto, olsSlots } from '../../../src/lib/stats/ols-trend';

// NIST/ITL StRD linear regression dataset "Norris" (file Norris.dat; data and certified values
// VERIFIED in REFERENCES.md §2a). Columns y, x in file order.
const norris: [number, number][] = [
  [0.1, 0.2], [338.8, 337.4], [118.1, 118.2], [888.0, 884.6], [9.2, 10.1], [228.1, 226.5], [668.5, 666.3],
  [998.5, 996.3], [449.1, 448.6], [778.9, 777.0], [559.2, 558.2], [0.3, 0.4], [0.1, 0.6], [778.1, 775.5],
  [668.8, 666.9], [339.3, 338.0], [448.9, 447.5], [10.8, 11.6], [557.7, 556.0], [228.3, 228.1], [998.0, 995.8],
  [888.8, 887.6], [119.6, 120.2], [0.3, 0.3], [0.6, 0.3], [557.6, 556.8], [339.3, 339.1], [888.0, 887.2],
  [998.5, 999.0], [778.9, 779.0], [10.2, 11.1], [117.6, 118.3], [228.9, 229.2], [668.4, 669.1], [449.2, 448.9],
  [0.2, 0.5],
];
const certified = {
  intercept: -0.262323073774029,
  slope: 1.00211681802045,
  interceptSd: 0.232818234301152,
  slopeSd: 0.429796848199937e-3,
  residualSd: 0.884796396144373,
  rSquared: 0.999993745883712,
};

// Log relative error: the number of agreeing significant digits (NIST's LRE).
const lre = (computed: number, expected: number): number =>
  computed === expected ? 16 : -Math.log10(Math.abs(computed - expected) / Math.abs(expected));

describe('NIST StRD Norris certified values (x used as the "time" axis)', () => {
  const x = Float64Array.from(norris, (row) => row[1]);
  const y = Float64Array.from(norris, (row) => row[0]);
  const out = olsTrendInto(x, y, new Float64Array(8));
  const cases: [string, number, number][] = [
    ['B0 intercept', out[olsSlots.intercept] as number, certified.intercept],
    ['B1 slope', out[olsSlots.slopePerDay] as number, certified.slope],
    ['sd(B0)', out[olsSlots.interceptStandardError] as number, certified.interceptSd],
    ['sd(B1)', out[olsSlots.slopeStandardErrorPerDay] as number, certified.slopeSd],
    ['residual SD', out[olsSlots.residualSd] as number, certified.residualSd],
    ['R²', out[olsSlots.rSquared] as number, certified.rSquared],
  ];
  for (const [name, computed, expected] of cases) {
    it(`${name}: LRE ≥ 9 (relative error ≤ 1e-9)`, () => {
      expect(lre(computed, expected)).toBeGreaterThanOrEqual(9);
    });
  }
  it('36 observations', () => {
    expect(out[olsSlots.n]).toBe(36);
  });
});
