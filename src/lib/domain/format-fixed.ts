/**
 * `value.toFixed(digits)` without a minus sign on a figure that rounds to zero: toFixed keeps the sign of
 * a small negative number (−0.04 → "-0.0"), which reads as a real negative angle. Non-finite values are
 * returned as toFixed gives them ("NaN", "Infinity").
 */
export function formatFixed(value: number, digits: number): string {
  const text = value.toFixed(digits);
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}
