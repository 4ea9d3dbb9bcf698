import { quantileSorted } from './quantile-sorted';
import { standardisedResponseMean } from './standardised-response-mean';
import { StatsInputError } from './stats-input-error';
import { wilcoxonSignedRank, type WilcoxonSignedRank } from './wilcoxon-signed-rank';
import { wilsonInterval } from './wilson-interval';

/** Summary of one measure's change from baseline over many patients. */
export interface CohortChangeSummary {
  /** Patients with a change (NaN skipped). */
  readonly n: number;
  /** Median change and quartiles, Hyndman & Fan type 7 (R's default). In grade steps for ordinal measures. */
  readonly medianChange: number;
  readonly quartiles: readonly [number, number];
  readonly iqr: number;
  /** Patients whose change in the better direction is at least the MDC; null without an MDC. */
  readonly improvedBeyondMdc: {
    readonly count: number;
    readonly proportion: number;
    /** Wilson 95 % interval (Newcombe 1998, method 3). */
    readonly wilson95: readonly [number, number];
  } | null;
  /** Wilcoxon signed-rank test of the changes against zero (zeros dropped). */
  readonly wilcoxon: WilcoxonSignedRank;
  /** Mean change / SD of change. */
  readonly standardisedResponseMean: number;
}

/**
 * Cohort summary of changes (follow-up − baseline, one per patient) for one measure: n, median
 * and interquartile range (type 7 quantiles), the proportion improved by at least the MDC in the
 * better direction with its Wilson 95 % interval, the Wilcoxon signed-rank test and the
 * standardised response mean. The median of ordinal changes is in grade steps and may be a half
 * step; it is a summary of changes, never a grade. `mdc` null leaves improvedBeyondMdc null; an
 * array gives each change its own MDC (when patients' comparisons differ in instrument or raters).
 * NaN changes are skipped; with none left the statistics are NaN. Cost O(n log n).
 * Throws StatsInputError for an MDC ≤ 0 or infinite changes.
 */
export function cohortChangeSummary(
  changes: ArrayLike<number>,
  betterWhen: 'lower' | 'higher',
  mdc: number | ArrayLike<number> | null,
): CohortChangeSummary {
  const mdcOf = (i: number): number => (typeof mdc === 'number' ? mdc : ((mdc as ArrayLike<number>)[i] as number));
  if (mdc !== null) {
    if (typeof mdc !== 'number' && mdc.length !== changes.length) {
      throw new StatsInputError(`cohortChangeSummary: ${mdc.length} MDCs for ${changes.length} changes`);
    }
    for (let i = 0; i < (typeof mdc === 'number' ? 1 : mdc.length); i++) {
      const m = mdcOf(i);
      if (!(m > 0) || !Number.isFinite(m)) throw new StatsInputError(`cohortChangeSummary: MDC ${m} must be positive and finite`);
    }
  }
  const present: number[] = [];
  const presentMdc: number[] = [];
  for (let i = 0; i < changes.length; i++) {
    const value = changes[i] as number;
    if (Number.isNaN(value)) continue;
    if (!Number.isFinite(value)) throw new StatsInputError(`cohortChangeSummary: change ${i} is ${value}`);
    present.push(value);
    if (mdc !== null) presentMdc.push(mdcOf(i));
  }
  const sorted = Float64Array.from(present).sort();
  const n = sorted.length;
  const q1 = quantileSorted(sorted, 0.25);
  const q3 = quantileSorted(sorted, 0.75);
  let improvedBeyondMdc: CohortChangeSummary['improvedBeyondMdc'] = null;
  if (mdc !== null) {
    let count = 0;
    present.forEach((change, i) => {
      if ((betterWhen === 'lower' ? -change : change) >= (presentMdc[i] as number)) count++;
    });
    improvedBeyondMdc = { count, proportion: n > 0 ? count / n : Number.NaN, wilson95: wilsonInterval(count, n) };
  }
  return {
    n,
    medianChange: quantileSorted(sorted, 0.5),
    quartiles: [q1, q3],
    iqr: q3 - q1,
    improvedBeyondMdc,
    wilcoxon: wilcoxonSignedRank(sorted),
    standardisedResponseMean: standardisedResponseMean(sorted),
  };
}
