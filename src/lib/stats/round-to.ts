/**
 * Rounds to `digits` decimal places, halves away from zero for positive numbers and towards +∞ for
 * negative ones (Math.round's rule), for figures quoted in messages and warnings. Not for stored
 * values: binary floating point makes 1.005 round to 1 (it is 1.00499… in binary).
 *
 * @example
 * roundTo(3.14159, 2); // 3.14
 */
export function roundTo(x: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}
