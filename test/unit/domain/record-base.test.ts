import { describe, expect, it } from 'vitest';
import { isIsoDateTime } from '../../../src/lib/domain/record-base';
import { mulberry32 } from '../../support/seeded-random';

// The date-time check against ECMAScript's own Date (ECMA-262 §21.4.1.32, the date time string
// format, and Date.prototype.toISOString): a string is a valid stamp exactly when Date reads it
// and writes the same text back (Date rolls 30 February and 24:00 over, so those come back changed).
const byDate = (s: string) => {
  const d = new Date(s);
  return !Number.isNaN(d.getTime()) && d.toISOString() === s;
};

describe('isIsoDateTime', () => {
  it('agrees with Date on 50,000 near-miss and valid stamps', () => {
    const rand = mulberry32(2026);
    const two = (max: number) => String(Math.floor(rand() * max)).padStart(2, '0');
    let valid = 0;
    for (let n = 0; n < 50_000; n++) {
      const year = rand() < 0.1 ? String(Math.floor(rand() * 10_000)).padStart(4, '0') : String(1896 + Math.floor(rand() * 210));
      let s = `${year}-${two(14)}-${two(33)}T${two(26)}:${two(62)}:${two(62)}.${String(Math.floor(rand() * 1000)).padStart(3, '0')}Z`;
      if (rand() < 0.05) {
        // One character replaced: a letter, a separator moved, a space, a non-ASCII digit.
        const at = Math.floor(rand() * s.length);
        s = s.slice(0, at) + ['x', '-', ':', ' ', '٣', 'Z', '0'][Math.floor(rand() * 7)] + s.slice(at + 1);
      }
      if (rand() < 0.02) s = rand() < 0.5 ? s.slice(0, -1) : `${s} `;
      if (byDate(s)) valid++;
      if (isIsoDateTime(s) !== byDate(s)) expect.fail(`${s}: isIsoDateTime ${isIsoDateTime(s)}, Date ${byDate(s)}`);
    }
    expect(valid).toBeGreaterThan(5_000);
  });

  it('knows leap years by the Gregorian rule', () => {
    expect(['2024-02-29T00:00:00.000Z', '2000-02-29T00:00:00.000Z', '0048-02-29T00:00:00.000Z'].map(isIsoDateTime)).toEqual([true, true, true]);
    expect(['2025-02-29T00:00:00.000Z', '1900-02-29T00:00:00.000Z', '2100-02-29T12:00:00.000Z'].map(isIsoDateTime)).toEqual([false, false, false]);
  });
});
