/**
 * Standardised response mean (Liang, Fossel & Larson 1990): mean change divided by the standard
 * deviation of change (n − 1 denominator), computed in two passes about the mean. NaN values are
 * skipped; NaN for fewer than 2 changes or zero SD.
 */
export function standardisedResponseMean(changes: ArrayLike<number>): number {
  let n = 0;
  let sum = 0;
  for (let i = 0; i < changes.length; i++) {
    const value = changes[i] as number;
    if (Number.isNaN(value)) continue;
    n++;
    sum += value;
  }
  if (n < 2) return Number.NaN;
  const mean = sum / n;
  let squares = 0;
  for (let i = 0; i < changes.length; i++) {
    const value = changes[i] as number;
    if (Number.isNaN(value)) continue;
    squares += (value - mean) ** 2;
  }
  const sd = Math.sqrt(squares / (n - 1));
  return sd > 0 ? mean / sd : Number.NaN;
}
