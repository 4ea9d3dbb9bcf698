import { describe, expect, it } from 'vitest';
import { changeVerdict, StatsInputError } from '../../../src/lib/stats';
import { reliableChangeIndex } from '../../../src/lib/stats/reliable-change-index';
import { selectBaseline } from '../../../src/lib/stats/select-baseline';
import { type MeasureScale } from '../../../src/lib/stats/change-verdict';

const ashworth: MeasureScale = { kind: 'ordinal', grades: ['0', '1', '1+', '2', '3', '4'].map((label, rank) => ({ label, rank })) };
const degrees: MeasureScale = { kind: 'continuous', unit: 'deg' };
const reference = { value: 1, source: 'reference' as const, citation: 'invented reference 2020' };
const local = { value: 6, source: 'local' as const, citation: 'clinic study, March' };

describe('selectBaseline', () => {
  const times = new Float64Array([0, 14, 28, 42, 56]);
  const values = new Float64Array([Number.NaN, 20, 24, 30, 31]);
  it('first assessment (skipping a missing value)', () => {
    expect(selectBaseline(times, values, { kind: 'first' }, false)).toEqual({ low: 20, high: 20, indices: [1] });
  });
  it('last assessment strictly before the event', () => {
    expect(selectBaseline(times, values, { kind: 'lastBeforeEvent', eventDay: 42 }, false)).toEqual({ low: 24, high: 24, indices: [2] });
    expect(selectBaseline(times, values, { kind: 'lastBeforeEvent', eventDay: 10 }, false)).toBeNull();
  });
  it('mean of the first two for continuous scores', () => {
    expect(selectBaseline(times, values, { kind: 'meanOfFirstTwo' }, false)).toEqual({ low: 22, high: 22, indices: [1, 2] });
  });
  it('ordinal: two grades give their range, never a fractional grade', () => {
    const ranks = new Float64Array([3, 2, 2, 1, 1]);
    const baseline = selectBaseline(times, ranks, { kind: 'meanOfFirstTwo' }, true);
    expect(baseline).toEqual({ low: 2, high: 3, indices: [0, 1] });
    expect(Number.isInteger(baseline?.low) && Number.isInteger(baseline?.high)).toBe(true);
  });
  it('empty series, mismatched lengths, unordered times', () => {
    expect(selectBaseline(new Float64Array(0), new Float64Array(0), { kind: 'first' }, false)).toBeNull();
    expect(() => selectBaseline(times, new Float64Array(2), { kind: 'first' }, false)).toThrow(StatsInputError);
    expect(() => selectBaseline(new Float64Array([3, 1]), new Float64Array(2), { kind: 'first' }, false)).toThrow(/ascending/);
  });
});

describe('changeVerdict', () => {
  it('continuous, higher is better, local MDC: improved / no change / worsened around ±MDC', () => {
    const base = { measureLabel: 'Knee extension range', betterWhen: 'higher' as const, scale: degrees, baseline: { low: 20, high: 20 }, mdc: local };
    const improved = changeVerdict({ ...base, followUp: 26 });
    expect(improved.verdict).toBe('improved');
    expect(improved.change).toBe(6);
    expect(improved.mdcUsed).toBe(local);
    expect(improved.text).toBe(
      'Improved from 20.0 deg to 26.0 deg (+6.0 deg), beyond measurement error (MDC 6 deg).',
    );
    expect(changeVerdict({ ...base, followUp: 25.9 }).verdict).toBe('no-change');
    expect(changeVerdict({ ...base, followUp: 14.1 }).verdict).toBe('no-change');
    expect(changeVerdict({ ...base, followUp: 14 }).verdict).toBe('worsened');
    expect(changeVerdict({ ...base, followUp: 25 }).text).toMatch(/no change beyond measurement error/i);
    // A change that rounds to zero is "0", not "-0" or "+0" (toFixed keeps the sign of -0.3).
    expect(changeVerdict({ ...base, mdc: null, followUp: 19.96 }).text).toMatch(/\(0\.0 deg\)/);
    expect(changeVerdict({ ...base, mdc: null, followUp: 20.04 }).text).toMatch(/\(0\.0 deg\)/);
  });

  it('lower is better (Modified Ashworth): a fall of one grade with a reference MDC of 1 grade', () => {
    const verdict = changeVerdict({ measureLabel: 'Elbow flexor tone', betterWhen: 'lower', scale: ashworth, baseline: { low: 2, high: 2 }, followUp: 1, mdc: reference });
    expect(verdict.verdict).toBe('improved');
    expect(verdict.change).toBe(-1);
    expect(verdict.text).toBe(
      'Improved from grade 1+ to grade 1 (-1 grade step), beyond measurement error (MDC 1 grade step).',
    );
    const worse = changeVerdict({ measureLabel: 'Elbow flexor tone', betterWhen: 'lower', scale: ashworth, baseline: { low: 2, high: 2 }, followUp: 3, mdc: reference });
    expect(worse.verdict).toBe('worsened');
  });

  it('ordinal range baseline is judged conservatively from both ends and never shows a fractional grade', () => {
    const base = { measureLabel: 'Ankle tone', betterWhen: 'lower' as const, scale: ashworth, baseline: { low: 2, high: 3 }, mdc: reference };
    // From grades 1+ and 2 to 1+: one step down from 2 but none from 1+ → no change.
    const same = changeVerdict({ ...base, followUp: 2 });
    expect(same.verdict).toBe('no-change');
    expect(same.change).toBeNaN();
    expect(same.changeRange).toEqual([-1, 0]);
    expect(same.text).toContain('from grades 1+ and 2 at baseline to grade 1+');
    expect(same.text).not.toMatch(/\d\.\d/);
    expect(changeVerdict({ ...base, followUp: 1 }).verdict).toBe('improved');
    expect(changeVerdict({ ...base, followUp: 3 }).verdict).toBe('no-change');
    expect(changeVerdict({ ...base, followUp: 4 }).verdict).toBe('worsened');
  });

  it('without an MDC the verdict says so and does not guess', () => {
    const verdict = changeVerdict({ measureLabel: 'Hip abduction range', betterWhen: 'higher', scale: degrees, baseline: { low: 30, high: 30 }, followUp: 60, mdc: null });
    expect(verdict.verdict).toBe('no-mdc');
    expect(verdict.mdcUsed).toBeNull();
    expect(verdict.text).toContain('cannot be judged');
    // No change at all is said plainly, not as "cannot say".
    const same = changeVerdict({ measureLabel: 'Spasm frequency', betterWhen: 'lower', scale: { kind: 'continuous', unit: '', decimals: 0 }, baseline: { low: 2, high: 2 }, followUp: 2, mdc: null });
    expect(same.text).toBe('Unchanged at 2.');
  });

  it('refuses ranks outside the scale, a non-positive MDC, non-finite values', () => {
    const base = { measureLabel: 'Tone', betterWhen: 'lower' as const, scale: ashworth, baseline: { low: 2, high: 2 }, mdc: reference };
    expect(() => changeVerdict({ ...base, followUp: 2.5 })).toThrow(/not a grade/);
    expect(() => changeVerdict({ ...base, followUp: 7 })).toThrow(/not a grade/);
    expect(() => changeVerdict({ ...base, followUp: 1, mdc: { ...reference, value: 0 } })).toThrow(/MDC/);
    expect(() => changeVerdict({ ...base, followUp: Number.NaN })).toThrow(StatsInputError);
  });
});

describe('reliableChangeIndex (Jacobson & Truax 1991)', () => {
  it('synthetic check of the formula: SD 7.5, r .80, 32 → 53 (REFERENCES.md §6c, arithmetic RECOMPUTED, attribution MEMORY)', () => {
    const rc = reliableChangeIndex(32, 53, 7.5, 0.8);
    expect(rc.standardError).toBeCloseTo(3.3541, 4);
    expect(rc.sDiff).toBeCloseTo(4.7434, 4);
    expect(rc.index).toBeCloseTo(4.43, 2);
    expect(rc.reliable).toBe(true);
    expect(1.96 * rc.sDiff).toBeCloseTo(9.3, 2);
  });
  it('below 1.96 is not reliable; perfect reliability gives NaN; bad input throws', () => {
    expect(reliableChangeIndex(32, 40, 7.5, 0.8).reliable).toBe(false);
    expect(reliableChangeIndex(1, 2, 5, 1).index).toBeNaN();
    expect(() => reliableChangeIndex(1, 2, -1, 0.5)).toThrow(StatsInputError);
    expect(() => reliableChangeIndex(1, 2, 1, 1.5)).toThrow(/reliability/);
  });
});
