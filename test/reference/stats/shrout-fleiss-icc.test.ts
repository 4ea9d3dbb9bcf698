import { describe, expect, it } from 'vitest';
import recomputed from '../../fixtures/stats/scipy-recomputed.json';
import { anovaMeanSquares, intraclassCorrelations } from '../../../src/lib/stats';
import { mcGrawWongNames } from '../../../src/lib/stats/intraclass-correlations';
import { relativeError } from '../../support/relative-error';

// Shrout PE, Fleiss JL (1979), Psychological Bulletin 86:420–428, Table 2: 6 targets × 4 judges.
// Data VERIFIED in REFERENCES.md §1a (psych test file copy). The worked @example of intraclassCorrelations.
const table = new Float64Array([9, 2, 5, 8, 6, 1, 3, 2, 8, 4, 6, 8, 7, 1, 2, 6, 10, 5, 6, 9, 6, 2, 4, 7]);
type Form = '1,1' | '2,1' | '3,1' | '1,k' | '2,k' | '3,k';
const forms: Form[] = ['1,1', '2,1', '3,1', '1,k', '2,k', '3,k'];

const ms = anovaMeanSquares(table, 6, 4);
const icc = intraclassCorrelations(ms);

describe('Shrout & Fleiss (1979) example', () => {
  it('ICCs match Table 4 to 2 decimals (VERIFIED: psych test_ICC.R asserts .17 .29 .71 .44 .62 .91)', () => {
    const published: Record<Form, number> = { '1,1': 0.17, '2,1': 0.29, '3,1': 0.71, '1,k': 0.44, '2,k': 0.62, '3,k': 0.91 };
    for (const form of forms) expect(Math.abs(icc[form].value - published[form])).toBeLessThanOrEqual(0.005);
  });

  it('ICCs match the DescTools ICC() printout to 3 decimals (VERIFIED in REFERENCES.md §1c)', () => {
    const printed: Record<Form, number> = { '1,1': 0.166, '2,1': 0.29, '3,1': 0.715, '1,k': 0.443, '2,k': 0.62, '3,k': 0.909 };
    for (const form of forms) expect(Math.abs(icc[form].value - printed[form])).toBeLessThanOrEqual(0.0005);
  });

  it('95 % intervals match the psych ICC() printout to its printed digits (VERIFIED in REFERENCES.md §1d)', () => {
    // [lower, decimals printed, upper, decimals printed]
    const psych: Record<Form, [number, number, number, number]> = {
      '1,1': [-0.133, 3, 0.72, 2],
      '2,1': [0.019, 3, 0.76, 2],
      '3,1': [0.342, 3, 0.95, 2],
      '1,k': [-0.884, 3, 0.91, 2],
      '2,k': [0.071, 3, 0.93, 2],
      '3,k': [0.676, 3, 0.99, 2],
    };
    for (const form of forms) {
      const [lo, loDigits, hi, hiDigits] = psych[form];
      expect(Math.abs(icc[form].ci[0] - lo)).toBeLessThanOrEqual(0.5 * 10 ** -loDigits + 1e-12);
      expect(Math.abs(icc[form].ci[1] - hi)).toBeLessThanOrEqual(0.5 * 10 ** -hiDigits + 1e-12);
    }
  });

  const sf = recomputed.shroutFleiss;
  it(`mean squares, ICCs, intervals, p and Satterthwaite df at full precision (RECOMPUTED: ${sf.source})`, () => {
    expect(relativeError(ms.msRows, sf.msRows)).toBeLessThan(1e-13);
    expect(relativeError(ms.msColumns, sf.msColumns)).toBeLessThan(1e-13);
    expect(relativeError(ms.msError, sf.msError)).toBeLessThan(1e-13);
    expect(relativeError(ms.msWithin, sf.msWithin)).toBeLessThan(1e-13);
    expect(relativeError(icc.satterthwaiteDf, sf.satterthwaiteDf)).toBeLessThan(1e-12);
    for (const form of forms) {
      const [value, lo, hi, p] = sf.icc[form] as [number, number, number, number];
      expect(relativeError(icc[form].value, value)).toBeLessThan(1e-13);
      expect(relativeError(icc[form].ci[0], lo)).toBeLessThan(1e-9);
      expect(relativeError(icc[form].ci[1], hi)).toBeLessThan(1e-9);
      expect(relativeError(icc[form].p, p)).toBeLessThan(1e-9);
    }
  });

  it('ANOVA table rounded as in REFERENCES.md §1b (RECOMPUTED 11.2417, 32.4861, 1.0194, 6.2639) and F ratios 1.79, 11.03 (VERIFIED)', () => {
    expect(ms.msRows).toBeCloseTo(11.2417, 4);
    expect(ms.msColumns).toBeCloseTo(32.4861, 4);
    expect(ms.msError).toBeCloseTo(1.0194, 4);
    expect(ms.msWithin).toBeCloseTo(6.2639, 4);
    expect(icc['1,1'].f).toBeCloseTo(1.79, 2);
    expect(icc['3,1'].f).toBeCloseTo(11.03, 2);
  });

  it('McGraw & Wong (1996) names', () => {
    expect(mcGrawWongNames).toEqual({
      '1,1': 'ICC(1)',
      '2,1': 'ICC(A,1)',
      '3,1': 'ICC(C,1)',
      '1,k': 'ICC(k)',
      '2,k': 'ICC(A,k)',
      '3,k': 'ICC(C,k)',
    });
  });
});
