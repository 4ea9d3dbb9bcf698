import { describe, expect, it } from 'vitest';
import { formatFixed } from '../../../src/lib/domain/format-fixed';

describe('formatFixed', () => {
  // Expected strings written by hand from the rounding rule (toFixed's own output with the sign dropped on zero).
  it.each([
    { value: -0.04, digits: 1, expected: '0.0' },
    { value: -0.4, digits: 0, expected: '0' },
    { value: -0, digits: 2, expected: '0.00' },
    { value: -0.05, digits: 1, expected: '-0.1' },
    { value: -1.23, digits: 1, expected: '-1.2' },
    { value: 12.345, digits: 0, expected: '12' },
    { value: -10.04, digits: 1, expected: '-10.0' },
  ])('$value with $digits digits → $expected', ({ value, digits, expected }) => {
    expect(formatFixed(value, digits)).toBe(expected);
  });
});
