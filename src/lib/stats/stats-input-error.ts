/**
 * Malformed input to a statistics function: wrong lengths, non-finite values where finite ones are
 * required, a parameter out of its domain. The message names what is wrong and where.
 * A statistically undefined result (zero variance, too few points) is not an error: it is NaN, as
 * each function documents.
 */
export class StatsInputError extends Error {
  override readonly name = 'StatsInputError';
}
