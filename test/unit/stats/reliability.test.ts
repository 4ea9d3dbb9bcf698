import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { anovaMeanSquares, completeSubjects, intraclassCorrelations, mdcFromSem, MissingCellError, semFromMeanSquareError, StatsInputError } from '../../../src/lib/stats';
import { semFromSdAndIcc } from '../../../src/lib/stats/measurement-error';
import { relativeError } from '../../support/relative-error';

const forms = ['1,1', '2,1', '3,1', '1,k', '2,k', '3,k'] as const;
// Shrout & Fleiss (1979) Table 2 (REFERENCES.md §1a, VERIFIED).
const sf = new Float64Array([9, 2, 5, 8, 6, 1, 3, 2, 8, 4, 6, 8, 7, 1, 2, 6, 10, 5, 6, 9, 6, 2, 4, 7]);

const tableArbitrary = fc
  .record({ n: fc.integer({ min: 2, max: 12 }), k: fc.integer({ min: 2, max: 5 }) })
  .chain(({ n, k }) =>
    fc.record({
      n: fc.constant(n),
      k: fc.constant(k),
      scores: fc.array(fc.integer({ min: -50, max: 50 }), { minLength: n * k, maxLength: n * k }),
    }),
  );

describe('ICC properties', () => {
  it('unchanged when subjects are reordered (property)', () => {
    fc.assert(
      fc.property(tableArbitrary, fc.integer(), ({ n, k, scores }, seed) => {
        const table = Float64Array.from(scores);
        const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => ((a * 7919 + seed) % 13) - ((b * 7919 + seed) % 13));
        const shuffled = new Float64Array(n * k);
        order.forEach((row, i) => shuffled.set(table.subarray(row * k, row * k + k), i * k));
        const a = intraclassCorrelations(anovaMeanSquares(table, n, k));
        const b = intraclassCorrelations(anovaMeanSquares(shuffled, n, k));
        for (const form of forms) {
          if (Number.isNaN(a[form].value)) expect(b[form].value).toBeNaN();
          else expect(Math.abs(a[form].value - b[form].value)).toBeLessThan(1e-9);
        }
      }),
      { numRuns: 100, seed: 3 },
    );
  });

  it('unchanged by shifting and positive scaling of all scores; consistency forms ignore a rater offset', () => {
    fc.assert(
      fc.property(tableArbitrary, fc.double({ min: -1e3, max: 1e3, noNaN: true }), fc.double({ min: 0.01, max: 100, noNaN: true }), ({ n, k, scores }, shift, scale) => {
        const table = Float64Array.from(scores);
        const moved = table.map((v) => v * scale + shift);
        const offset = table.map((v, i) => v + (i % k) * 3.5);
        const a = intraclassCorrelations(anovaMeanSquares(table, n, k));
        const b = intraclassCorrelations(anovaMeanSquares(moved, n, k));
        const c = intraclassCorrelations(anovaMeanSquares(offset, n, k));
        for (const form of forms) {
          if (!Number.isFinite(a[form].value)) continue;
          expect(Math.abs(a[form].value - b[form].value)).toBeLessThan(1e-7);
        }
        if (Number.isFinite(a['3,1'].value)) expect(Math.abs(a['3,1'].value - c['3,1'].value)).toBeLessThan(1e-9);
      }),
      { numRuns: 100, seed: 4 },
    );
  });

  it('perfect agreement gives 1 for every form with intervals [1, 1]', () => {
    const subjects = [3, 7, 1, 9, 4];
    const table = Float64Array.from(subjects.flatMap((v) => [v, v, v]));
    const icc = intraclassCorrelations(anovaMeanSquares(table, 5, 3));
    for (const form of forms) {
      expect(icc[form].value).toBe(1);
      expect(icc[form].ci).toEqual([1, 1]);
    }
  });

  it('consistent raters with a constant offset: ICC(3,·) = 1, ICC(2,·) < 1 with a finite interval', () => {
    const subjects = [3, 7, 1, 9, 4, 6];
    const table = Float64Array.from(subjects.flatMap((v) => [v, v + 2, v + 4]));
    const icc = intraclassCorrelations(anovaMeanSquares(table, 6, 3));
    expect(icc['3,1'].value).toBe(1);
    expect(icc['3,1'].ci).toEqual([1, 1]);
    expect(icc['2,1'].value).toBeLessThan(1);
    expect(icc['2,1'].ci[0]).toBeLessThan(icc['2,1'].value);
    expect(icc['2,1'].ci[1]).toBeGreaterThan(icc['2,1'].value);
  });

  it('each interval contains its estimate; wider at 99 % than at 95 %', () => {
    const ms = anovaMeanSquares(sf, 6, 4);
    const at95 = intraclassCorrelations(ms, 0.95);
    const at99 = intraclassCorrelations(ms, 0.99);
    for (const form of forms) {
      expect(at95[form].ci[0]).toBeLessThan(at95[form].value);
      expect(at95[form].ci[1]).toBeGreaterThan(at95[form].value);
      expect(at99[form].ci[0]).toBeLessThan(at95[form].ci[0]);
      expect(at99[form].ci[1]).toBeGreaterThan(at95[form].ci[1]);
    }
  });

  it('a table with no variation gives NaN, not a number', () => {
    const icc = intraclassCorrelations(anovaMeanSquares(new Float64Array(8).fill(5), 4, 2));
    for (const form of forms) expect(icc[form].value).toBeNaN();
  });

  it('mean squares are exact for offset data (two-pass about the mean)', () => {
    const big = sf.map((v) => v + 1e9);
    const a = anovaMeanSquares(sf, 6, 4);
    const b = anovaMeanSquares(big, 6, 4);
    expect(relativeError(b.msError, a.msError)).toBeLessThan(1e-6);
    expect(relativeError(b.msRows, a.msRows)).toBeLessThan(1e-6);
  });

  it('refuses malformed tables', () => {
    expect(() => anovaMeanSquares(new Float64Array(4), 1, 4)).toThrow(/at least 2 subjects/);
    expect(() => anovaMeanSquares(new Float64Array(5), 2, 3)).toThrow(/do not fill/);
    expect(() => anovaMeanSquares(new Float64Array([1, 2, Number.NaN, 4]), 2, 2)).toThrow(/subject 2, trial 1/);
    expect(() => intraclassCorrelations(anovaMeanSquares(sf, 6, 4), 1)).toThrow(StatsInputError);
  });
});

describe('missing cells', () => {
  const table = { subjectIds: ['a', 'b', 'c', 'd'], trialCount: 2, scores: new Float64Array([1, 2, 3, Number.NaN, 5, 6, 7, 8]) };
  it('refuse: MissingCellError names the row, subject and trial', () => {
    try {
      completeSubjects(table, 'refuse');
      expect.fail('should throw');
    } catch (error) {
      expect(error).toBeInstanceOf(MissingCellError);
      const missing = error as MissingCellError;
      expect([missing.rowIndex, missing.subjectId, missing.trialIndex]).toEqual([1, 'b', 1]);
      expect(missing.message).toMatch(/subject "b" \(row 2\) has no score for trial 2/);
    }
  });
  it('drop: removes the subject and warns', () => {
    const result = completeSubjects(table, 'drop');
    expect(result.table.subjectIds).toEqual(['a', 'c', 'd']);
    expect(Array.from(result.table.scores)).toEqual([1, 2, 5, 6, 7, 8]);
    expect(result.warnings).toEqual(['dropped subject "b" (row 2): no score for trial 2']);
  });
});

describe('SEM and MDC (Weir 2005 formulas, REFERENCES.md §6a)', () => {
  it('SEM = √MSerror; MDC95 = 1.96·√2·SEM ≈ 2.772·SEM; MDC90 = 1.645·√2·SEM', () => {
    expect(semFromMeanSquareError(4)).toBe(2);
    expect(mdcFromSem(1, 95)).toBeCloseTo(2.772, 3);
    expect(relativeError(mdcFromSem(2.5, 90), 1.645 * Math.SQRT2 * 2.5)).toBeLessThan(1e-15);
  });
  it('SEM = SD·√(1 − ICC)', () => {
    expect(semFromSdAndIcc(10, 0.91)).toBeCloseTo(3, 12);
    expect(semFromSdAndIcc(10, 1)).toBe(0);
    expect(() => semFromSdAndIcc(10, 1.2)).toThrow(/ICC/);
    expect(() => semFromSdAndIcc(-1, 0.5)).toThrow(/SD/);
    expect(() => semFromMeanSquareError(-1)).toThrow(StatsInputError);
    expect(() => mdcFromSem(Number.NaN, 95)).toThrow(StatsInputError);
  });
});
