import { StatsInputError } from './stats-input-error';

/** Jacobson & Truax reliable change index and its parts. */
export interface ReliableChange {
  /** RC = (post − pre)/S_diff. */
  readonly index: number;
  /** SE = SD·√(1 − r_xx). */
  readonly standardError: number;
  /** S_diff = √(2·SE²). */
  readonly sDiff: number;
  /** True when |RC| > 1.96 (change unlikely, p < .05, to be measurement error alone). */
  readonly reliable: boolean;
}

/**
 * Reliable change index of Jacobson & Truax (1991), with the √2 of Christensen & Mendoza (1986):
 * RC = (post − pre)/√(2·(SD·√(1 − r))²). `sd` is the pretest (or norm) SD and `reliability` the
 * test–retest reliability r_xx. NaN when S_diff is 0 (perfect reliability or zero SD).
 * Throws StatsInputError for SD < 0, reliability outside (−∞, 1] or non-finite input.
 */
export function reliableChangeIndex(pre: number, post: number, sd: number, reliability: number): ReliableChange {
  if (!Number.isFinite(pre) || !Number.isFinite(post)) {
    throw new StatsInputError(`reliableChangeIndex: scores ${pre} → ${post} must be finite`);
  }
  if (!(sd >= 0) || !Number.isFinite(sd)) throw new StatsInputError(`reliableChangeIndex: SD ${sd} must be finite and ≥ 0`);
  if (!(reliability <= 1) || !Number.isFinite(reliability)) {
    throw new StatsInputError(`reliableChangeIndex: reliability ${reliability} must be finite and ≤ 1`);
  }
  const standardError = sd * Math.sqrt(1 - reliability);
  const sDiff = Math.sqrt(2 * standardError * standardError);
  const index = sDiff > 0 ? (post - pre) / sDiff : Number.NaN;
  return { index, standardError, sDiff, reliable: Math.abs(index) > 1.96 };
}
