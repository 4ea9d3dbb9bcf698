import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { addDays, dayNumber, handoverCode, weekStartOf } from '../../../src/lib/programme';
import { normaliseHandoverCode } from '../../../src/lib/programme/handover-code';

describe('calendar days', () => {
  // Fixtures: dates and their Monday, worked by hand from 2025-01-01 being a Wednesday (calendar),
  // and ISO 8601's rule that week 1 holds 4 January (2025-01-04, a Saturday → week starts 2024-12-30).
  const fixtures = [
    { input: '2025-03-01', expected: '2025-02-24', source: 'hand-worked: 2025-03-01 is a Saturday' },
    { input: '2025-03-03', expected: '2025-03-03', source: 'a Monday is its own week start' },
    { input: '2025-03-09', expected: '2025-03-03', source: 'a Sunday ends the week (ISO 8601)' },
    { input: '2025-01-04', expected: '2024-12-30', source: 'ISO 8601 week 1 of 2025 starts 2024-12-30' },
    { input: '2024-02-29', expected: '2024-02-26', source: 'hand-worked: leap day 2024 was a Thursday' },
  ];
  it.each(fixtures)('weekStartOf($input) = $expected ($source)', ({ input, expected }) => {
    expect(weekStartOf(input)).toBe(expected);
  });

  it('agrees with Date.getUTCDay for every day over 60 years (independent oracle)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 365 * 60 }), (n) => {
        const day = new Date(n * 86_400_000).toISOString().slice(0, 10);
        const monday = weekStartOf(day);
        const weekday = new Date(`${monday}T00:00:00Z`).getUTCDay();
        const gap = dayNumber(day) - dayNumber(monday);
        return weekday === 1 && gap >= 0 && gap <= 6;
      }),
    );
  });

  it('adds days across months and leap years, and refuses impossible dates', () => {
    expect(addDays('2024-02-28', 1)).toBe('2024-02-29');
    expect(addDays('2025-02-28', 1)).toBe('2025-03-01');
    expect(addDays('2025-01-01', -1)).toBe('2024-12-31');
    expect(() => dayNumber('2025-02-29')).toThrow(RangeError);
    expect(() => dayNumber('1 March')).toThrow(/not a calendar date/);
  });
});

describe('hand-over codes', () => {
  it('draws 10 letters of the unambiguous alphabet, evenly (rejection sampling)', () => {
    // mulberry32, a small seeded generator (public domain), so the test is repeatable.
    let state = 7;
    const next = () => {
      state = (state + 0x6d2b79f5) >>> 0;
      let t = state;
      t = Math.imul(t ^ (t >>> 15), t | 1);
      t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
      return ((t ^ (t >>> 14)) >>> 0) >>> 24;
    };
    const bytes = (n: number) => Uint8Array.from({ length: n }, next);
    const counts = new Map<string, number>();
    for (let i = 0; i < 3000; i++) {
      const code = handoverCode(bytes);
      expect(code).toMatch(/^[2-9A-HJKMNP-TV-Z]{5}-[2-9A-HJKMNP-TV-Z]{5}$/);
      for (const c of code.replace('-', '')) counts.set(c, (counts.get(c) ?? 0) + 1);
    }
    expect(counts.size).toBe(30);
    // 30,000 letters over 30: expect 1000 each; ±20 % is far beyond chance (σ ≈ 31).
    for (const n of counts.values()) expect(Math.abs(n - 1000)).toBeLessThan(200);
  });

  it('never uses bytes ≥ 240 (they would favour the first letters)', () => {
    const onlyHigh = (n: number) => new Uint8Array(n).fill(250);
    let calls = 0;
    const mostlyHigh = (n: number) => (calls++ < 3 ? onlyHigh(n) : new Uint8Array(n).fill(0));
    expect(handoverCode(mostlyHigh)).toBe('22222-22222');
  });

  it('reads a typed code whatever the case, spaces and dashes, and refuses look-alikes and wrong lengths', () => {
    expect(normaliseHandoverCode(' 7kq2m xd4ph ')).toBe('7KQ2M-XD4PH');
    expect(normaliseHandoverCode('7KQ2M-XD4PH')).toBe('7KQ2M-XD4PH');
    expect(normaliseHandoverCode('7KQ2M-XD4P')).toBeNull();
    expect(normaliseHandoverCode('7KQ2M-XD4P0')).toBeNull(); // 0 is not in the alphabet
    expect(normaliseHandoverCode('OKQ2M-XD4PH')).toBeNull(); // nor is O
    expect(normaliseHandoverCode('')).toBeNull();
  });
});
