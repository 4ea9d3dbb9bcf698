import { describe, expect, it } from 'vitest';
import recomputed from '../../fixtures/stats/scipy-recomputed.json';
import { wilcoxonSignedRank } from '../../../src/lib/stats/wilcoxon-signed-rank';
import { relativeError } from '../../support/relative-error';

// Darwin's maize height differences as in the scipy.stats.wilcoxon docstring (REFERENCES.md §5).
const maize = [6, 8, 14, 16, 23, 24, 28, 29, 41, -48, 49, 56, 60, -67, 75];

describe('Wilcoxon signed-rank: maize example', () => {
  const result = wilcoxonSignedRank(maize);
  it('W+ = 96, W− = 24, exact two-sided p = 0.041259765625 (VERIFIED: scipy docs)', () => {
    expect(result.wPlus).toBe(96);
    expect(result.wMinus).toBe(24);
    expect(result.statistic).toBe(24);
    expect(result.method).toBe('exact');
    expect(result.p).toBe(0.041259765625);
  });

  it('normal approximation with continuity correction: z = 2.016265, p = 0.043772 (RECOMPUTED, REFERENCES.md §5)', () => {
    const normal = wilcoxonSignedRank(maize, 'normal-cc');
    expect(Math.abs(normal.z)).toBeCloseTo(2.016265, 6);
    expect(normal.p).toBeCloseTo(0.043772, 6);
  });
});

describe(`against scipy (RECOMPUTED: ${recomputed.wilcoxon.source})`, () => {
  recomputed.wilcoxon.cases.forEach((c, index) => {
    it(`case ${index}: n = ${c.d.length}, ${c.call}`, () => {
      // Case 1 is scipy's forced asymptotic call on the untied maize data; the rest use scipy's
      // own 'auto' choice (exact for n ≤ 50 untied), which ours must match.
      const result = wilcoxonSignedRank(c.d, index === 1 ? 'normal-cc' : 'auto');
      expect(result.method).toBe(c.method);
      expect(result.statistic).toBe(c.statistic);
      expect(relativeError(result.p, c.p)).toBeLessThan(1e-9);
    });
  });
});
