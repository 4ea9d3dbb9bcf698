/**
 * A running sum with Neumaier's improved Kahan–Babuška compensation (Neumaier 1974): long sums of
 * mixed magnitudes lose no more than a few ulps. For sums built a term at a time (several side by
 * side, terms computed in the loop); `compensatedSum` sums an array with it. NaN propagates.
 *
 * @example
 * const area = new CompensatedAccumulator();
 * for (const term of [1e16, 1, -1e16]) area.add(term);
 * area.total; // 1 (a plain sum gives 0)
 */
export class CompensatedAccumulator {
  private sum = 0;
  private compensation = 0;

  add(value: number): void {
    const t = this.sum + value;
    this.compensation += Math.abs(this.sum) >= Math.abs(value) ? this.sum - t + value : value - t + this.sum;
    this.sum = t;
  }

  get total(): number {
    return this.sum + this.compensation;
  }
}

/**
 * Sum of values[from..to) with Neumaier's improved Kahan–Babuška compensation (Neumaier 1974), so
 * long sums of mixed magnitudes lose no more than a few ulps. NaN propagates.
 *
 * @example
 * compensatedSum([1e16, 1, -1e16]); // 1
 */
export function compensatedSum(values: ArrayLike<number>, from = 0, to = values.length): number {
  const accumulator = new CompensatedAccumulator();
  for (let i = from; i < to; i++) accumulator.add(values[i] as number);
  return accumulator.total;
}
