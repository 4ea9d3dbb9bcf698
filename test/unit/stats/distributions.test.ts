import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import jStat from 'jstat';
import scipyGrid from '../../fixtures/stats/distributions-scipy.json';
import { StatsInputError } from '../../../src/lib/stats';
import { chiSquareCdf, chiSquareQuantile } from '../../../src/lib/stats/chi-square-distribution';
import { fCdf, fQuantile } from '../../../src/lib/stats/f-distribution';
import { normalCdf, normalQuantile } from '../../../src/lib/stats/normal-distribution';
import { studentTCdf, studentTQuantile } from '../../../src/lib/stats/student-t-distribution';
import { logGamma } from '../../../src/lib/stats/log-gamma';
import { relativeError } from '../../support/relative-error';

type Fn = (...args: number[]) => number;
const byName: Record<string, Fn> = {
  normalQuantile: (p) => normalQuantile(p as number),
  normalCdf: (x) => normalCdf(x as number),
  normalCdfUpper: (x) => normalCdf(x as number, true),
  studentTCdf: (t, df) => studentTCdf(t as number, df as number),
  studentTCdfUpper: (t, df) => studentTCdf(t as number, df as number, true),
  studentTQuantile: (p, df) => studentTQuantile(p as number, df as number),
  chiSquareCdf: (x, df) => chiSquareCdf(x as number, df as number),
  chiSquareCdfUpper: (x, df) => chiSquareCdf(x as number, df as number, true),
  chiSquareQuantile: (p, df) => chiSquareQuantile(p as number, df as number),
  fCdf: (x, a, b) => fCdf(x as number, a as number, b as number),
  fCdfUpper: (x, a, b) => fCdf(x as number, a as number, b as number, true),
  fQuantile: (p, a, b) => fQuantile(p as number, a as number, b as number),
};

describe('distributions against scipy (fixture: ' + scipyGrid.source + ')', () => {
  // 1386 values: normal, t (df 0.5 … 1e5, non-integer included), chi-square (df 0.5 … 1000) and F
  // (df 0.7 … 3000, Satterthwaite-like 4.785144) CDFs in both tails down to 1e-168 and quantiles
  // at p = 1e-12 … 1 − 1e-6. The issue asks for 1e-8 relative; measured worst is 2.2e-10 (t with
  // df = 1e5, where ln B(ν/2, ½) cancels), everything else ≤ 3e-12.
  const groups = new Map<string, typeof scipyGrid.rows>();
  for (const row of scipyGrid.rows) groups.set(row.fn, [...(groups.get(row.fn) ?? []), row]);
  for (const [name, rows] of groups) {
    it(`${name}: ${rows.length} values within 1e-9 relative`, () => {
      const fn = byName[name] as Fn;
      let worst = 0;
      for (const row of rows) {
        const error = relativeError(fn(...row.args), row.expected, 1e-300);
        worst = Math.max(worst, error);
        if (!(error <= 1e-9)) expect.fail(`${name}(${row.args.join(', ')}) = ${fn(...row.args)}, scipy ${row.expected}`);
      }
      expect(worst).toBeLessThanOrEqual(1e-9);
    });
  }
});

describe('closed forms and identities (a second route where jstat is not accurate enough)', () => {
  it('t with 1 df is Cauchy: F(t) = ½ + atan(t)/π, quantile tan(π(p − ½)) = −1/tan(πp)', () => {
    for (const t of [-1e6, -30, -2, -0.1, 0.7, 4, 1e3]) {
      const exact = t < 0 ? Math.atan(-1 / t) / Math.PI : 0.5 + Math.atan(t) / Math.PI;
      expect(relativeError(studentTCdf(t, 1), exact)).toBeLessThan(1e-12);
    }
    for (const p of [1e-9, 0.01, 0.2, 0.6, 0.975, 0.999]) {
      // −cot(πp) (or cot(π(1 − p))) avoids the pole of tan at ±π/2, where π(p − ½) loses digits.
      const exact = p < 0.5 ? -1 / Math.tan(Math.PI * p) : 1 / Math.tan(Math.PI * (1 - p));
      expect(relativeError(studentTQuantile(p, 1), exact)).toBeLessThan(1e-11);
    }
  });

  it('t with 2 df: F(t) = ½ + t/(2√(2 + t²)), quantile (2p − 1)·√(2/(4p(1 − p)))', () => {
    for (const t of [-50, -3, -0.2, 0.4, 2, 9]) {
      const exact = t < 0 ? 0.5 * (1 - -t / Math.sqrt(2 + t * t)) : 0.5 + t / (2 * Math.sqrt(2 + t * t));
      expect(relativeError(studentTCdf(t, 2), exact)).toBeLessThan(1e-12);
    }
    for (const p of [1e-6, 0.05, 0.3, 0.75, 0.99]) {
      const exact = (2 * p - 1) * Math.sqrt(2 / (4 * p * (1 - p)));
      expect(relativeError(studentTQuantile(p, 2), exact)).toBeLessThan(1e-11);
    }
  });

  it('chi-square with 2 df is exponential with mean 2', () => {
    for (const x of [1e-8, 0.1, 1, 5, 40, 600]) {
      expect(relativeError(chiSquareCdf(x, 2, true), Math.exp(-x / 2))).toBeLessThan(1e-13);
      expect(relativeError(chiSquareCdf(x, 2), -Math.expm1(-x / 2))).toBeLessThan(1e-13);
    }
    for (const p of [1e-10, 0.01, 0.5, 0.95, 1 - 1e-9]) {
      expect(relativeError(chiSquareQuantile(p, 2), -2 * Math.log1p(-p))).toBeLessThan(1e-11);
    }
  });

  it('F(1, n) is t² and F(d, d) has median 1 (jstat gives 1.0000001 for F(1, 1))', () => {
    for (const n of [1, 3, 7.5, 40]) {
      for (const p of [0.5, 0.9, 0.95, 0.999]) {
        const t = studentTQuantile(0.5 + p / 2, n);
        expect(relativeError(fQuantile(p, 1, n), t * t)).toBeLessThan(1e-11);
      }
      expect(relativeError(fQuantile(0.5, n, n), 1)).toBeLessThan(1e-13);
    }
  });

  it('symmetries: t(−x) tails, F ↔ 1/F with swapped df, Φ tails add to 1', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -40, max: 40, noNaN: true }),
        fc.double({ min: 0.3, max: 500, noNaN: true }),
        fc.double({ min: 0.3, max: 500, noNaN: true }),
        (x, a, b) => {
          expect(relativeError(studentTCdf(-x, a), studentTCdf(x, a, true))).toBeLessThan(1e-13);
          const f = Math.exp(x / 8);
          expect(relativeError(fCdf(f, a, b), fCdf(1 / f, b, a, true))).toBeLessThan(1e-12);
          expect(Math.abs(normalCdf(x) + normalCdf(x, true) - 1)).toBeLessThan(1e-15);
        },
      ),
      { numRuns: 200, seed: 5 },
    );
  });

  it('quantile ∘ CDF round trips (property, non-integer df)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-9, max: 1 - 1e-9, noNaN: true }),
        fc.double({ min: 0.5, max: 2000, noNaN: true }),
        fc.double({ min: 0.5, max: 2000, noNaN: true }),
        (p, a, b) => {
          expect(relativeError(normalCdf(normalQuantile(p)), p)).toBeLessThan(1e-12);
          expect(relativeError(studentTCdf(studentTQuantile(p, a), a), p)).toBeLessThan(1e-10);
          expect(relativeError(chiSquareCdf(chiSquareQuantile(p, a), a), p)).toBeLessThan(1e-10);
          expect(relativeError(fCdf(fQuantile(p, a, b), a, b), p)).toBeLessThan(1e-10);
        },
      ),
      { numRuns: 150, seed: 11 },
    );
  });

  it('ln Γ: factorials and Γ(½) = √π', () => {
    let factorial = 1;
    for (let n = 1; n <= 30; n++) {
      factorial *= n;
      expect(Math.abs(logGamma(n + 1) - Math.log(factorial))).toBeLessThan(1e-13 * Math.max(1, Math.log(factorial)));
    }
    expect(Math.abs(logGamma(0.5) - 0.5 * Math.log(Math.PI))).toBeLessThan(1e-15);
    expect(Math.abs(logGamma(1e-8) - 18.420680738180209)).toBeLessThan(1e-12); // −ln(1e-8) − γ·1e-8 to 1e-15
  });
});

describe('printed table values (from memory: standard t, chi-square, F and normal tables, 3–4 decimals)', () => {
  const cases: { got: () => number; expected: number; source: string }[] = [
    { got: () => normalQuantile(0.975), expected: 1.96, source: 'z 0.975 = 1.960 (normal table, from memory)' },
    { got: () => normalQuantile(0.95), expected: 1.645, source: 'z 0.95 = 1.645 (from memory)' },
    { got: () => studentTQuantile(0.975, 10), expected: 2.228, source: 't 0.975, 10 df = 2.228 (from memory)' },
    { got: () => studentTQuantile(0.975, 22), expected: 2.074, source: 't 0.975, 22 df = 2.074 (from memory)' },
    { got: () => studentTQuantile(0.995, 5), expected: 4.032, source: 't 0.995, 5 df = 4.032 (from memory)' },
    { got: () => chiSquareQuantile(0.95, 1), expected: 3.841, source: 'χ² 0.95, 1 df = 3.841 (from memory)' },
    { got: () => chiSquareQuantile(0.95, 10), expected: 18.307, source: 'χ² 0.95, 10 df = 18.307 (from memory)' },
    { got: () => fQuantile(0.95, 5, 15), expected: 2.901, source: 'F 0.95 (5, 15) = 2.90 (from memory)' },
    { got: () => fQuantile(0.95, 1, 10), expected: 4.965, source: 'F 0.95 (1, 10) = 4.96 (from memory)' },
  ];
  for (const c of cases) {
    it(c.source, () => {
      expect(Math.abs(c.got() - c.expected)).toBeLessThanOrEqual(0.0006);
    });
  }
});

describe('jstat 1.9.6 as a second oracle (accurate to about 1e-7 here, so a looser bound)', () => {
  // jstat's own error: measured up to 1.1e-7 relative in these ranges (its F quantile at the median
  // of F(1, 1), its t CDF at df = 1000); the tight checks are the scipy grid and closed forms above.
  // jstat's normal CDF loses digits in the tails (1.9 % relative at x = −8, all of them by x = −30),
  // so it is compared only for |x| ≤ 3; the tails are checked against scipy above.
  const probabilities = [1e-6, 0.001, 0.025, 0.1, 0.3, 0.6, 0.9, 0.975, 0.999];
  const dfs = [1, 2, 3.5, 5, 10, 30, 120];
  it('normal, t, chi-square and F quantiles and CDFs agree within 5e-7 relative', () => {
    for (const p of probabilities) {
      expect(relativeError(normalQuantile(p), jStat.normal.inv(p, 0, 1))).toBeLessThan(5e-7);
    }
    for (const x of [-3, -1, 0.5, 2, 3]) expect(relativeError(normalCdf(x), jStat.normal.cdf(x, 0, 1))).toBeLessThan(5e-7);
    for (const df of dfs) {
      for (const p of probabilities) {
        expect(relativeError(studentTQuantile(p, df), jStat.studentt.inv(p, df))).toBeLessThan(5e-7);
        expect(relativeError(chiSquareQuantile(p, df), jStat.chisquare.inv(p, df))).toBeLessThan(5e-7);
        for (const df2 of [1, 4.785, 15, 100]) {
          expect(relativeError(fQuantile(p, df, df2), jStat.centralF.inv(p, df, df2))).toBeLessThan(5e-7);
        }
      }
      for (const x of [-50, -4, -1, 0.3, 2, 9]) expect(relativeError(studentTCdf(x, df), jStat.studentt.cdf(x, df))).toBeLessThan(5e-7);
      for (const x of [0.01, 0.5, 3, 20, 200]) expect(relativeError(chiSquareCdf(x, df), jStat.chisquare.cdf(x, df))).toBeLessThan(5e-7);
    }
  });
});

describe('edges and errors', () => {
  it('quantiles at 0 and 1, the median of t, NaN propagation', () => {
    expect(normalQuantile(0)).toBe(Number.NEGATIVE_INFINITY);
    expect(normalQuantile(1)).toBe(Number.POSITIVE_INFINITY);
    expect(studentTQuantile(0.5, 3)).toBe(0);
    expect(studentTQuantile(0, 3)).toBe(Number.NEGATIVE_INFINITY);
    expect(chiSquareQuantile(0, 3)).toBe(0);
    expect(fQuantile(1, 3, 4)).toBe(Number.POSITIVE_INFINITY);
    expect(chiSquareCdf(-1, 3)).toBe(0);
    expect(fCdf(0, 3, 4, true)).toBe(1);
    expect(normalCdf(Number.NaN)).toBeNaN();
    expect(studentTQuantile(Number.NaN, 3)).toBeNaN();
  });

  it('throws StatsInputError for df ≤ 0 and probabilities outside [0, 1]', () => {
    expect(() => studentTCdf(1, 0)).toThrow(StatsInputError);
    expect(() => chiSquareQuantile(0.5, -1)).toThrow(/degrees of freedom/);
    expect(() => fQuantile(0.5, 2, Number.POSITIVE_INFINITY)).toThrow(StatsInputError);
    expect(() => normalQuantile(1.5)).toThrow(/outside \[0, 1\]/);
    expect(() => fQuantile(-0.1, 2, 3)).toThrow(StatsInputError);
  });
});
