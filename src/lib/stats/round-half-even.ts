/** Rounds to the nearest integer, ties to even (IEEE 754 default; numpy's `np.round`). */
export function roundHalfEven(x: number): number {
  const r = Math.round(x);
  // Math.round sends halves up; an exact half that landed on an odd integer goes back down.
  return Math.abs(x % 1) === 0.5 && r % 2 !== 0 ? r - 1 : r;
}
