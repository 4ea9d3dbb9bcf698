import { StatsInputError } from './stats-input-error';

/**
 * Standard error of measurement from the two-way ANOVA residual mean square, SEM = √MS_error
 * (Weir 2005, the form independent of the ICC chosen). Throws StatsInputError for a negative or
 * non-finite mean square.
 */
export function semFromMeanSquareError(msError: number): number {
  if (!(msError >= 0) || !Number.isFinite(msError)) {
    throw new StatsInputError(`semFromMeanSquareError: mean square ${msError} must be finite and ≥ 0`);
  }
  return Math.sqrt(msError);
}

/**
 * Standard error of measurement from a published SD and ICC, SEM = SD·√(1 − ICC) (Weir 2005), for
 * when only those are known. The SD is of all scores pooled; the value depends on which ICC form
 * was reported. An ICC ≤ 0 gives SEM ≥ SD, as computed.
 * Throws StatsInputError for SD < 0, ICC > 1 or non-finite input.
 */
export function semFromSdAndIcc(sd: number, icc: number): number {
  if (!(sd >= 0) || !Number.isFinite(sd)) throw new StatsInputError(`semFromSdAndIcc: SD ${sd} must be finite and ≥ 0`);
  if (!(icc <= 1) || !Number.isFinite(icc)) throw new StatsInputError(`semFromSdAndIcc: ICC ${icc} must be finite and ≤ 1`);
  return sd * Math.sqrt(1 - icc);
}

/** z multipliers as conventionally printed for the MDC (Weir 2005). */
const mdcZ = { 95: 1.96, 90: 1.645 } as const;

/**
 * Minimal detectable change at 95 % or 90 % confidence: MDC = z·√2·SEM with z = 1.96 or 1.645
 * (the rounded values used throughout the MDC literature, not the exact 1.959964…); √2 because a
 * change involves two error-laden scores. Throws StatsInputError for a negative or non-finite SEM.
 */
export function mdcFromSem(sem: number, level: 95 | 90): number {
  if (!(sem >= 0) || !Number.isFinite(sem)) throw new StatsInputError(`mdcFromSem: SEM ${sem} must be finite and ≥ 0`);
  return mdcZ[level] * Math.SQRT2 * sem;
}
