/**
 * Sum of values[from..to) with Neumaier's improved Kahan–Babuška compensation (Neumaier 1974), so
 * long sums of mixed magnitudes lose no more than a few ulps. NaN propagates.
 */
export function compensatedSum(values: ArrayLike<number>, from = 0, to = values.length): number {
  let sum = 0;
  let compensation = 0;
  for (let i = from; i < to; i++) {
    const value = values[i] as number;
    const t = sum + value;
    compensation += Math.abs(sum) >= Math.abs(value) ? sum - t + value : value - t + sum;
    sum = t;
  }
  return sum + compensation;
}
