import { compensatedSum } from './compensated-sum';
import { StatsInputError } from './stats-input-error';

/** Mean squares of a complete subjects × trials (or raters) table; names as in Shrout & Fleiss. */
export interface AnovaMeanSquares {
  /** Subjects (rows). */
  readonly subjectCount: number;
  /** Trials or raters (columns). */
  readonly trialCount: number;
  /** Between subjects, BMS, df n − 1. */
  readonly msRows: number;
  /** Between trials/raters, JMS, df k − 1. */
  readonly msColumns: number;
  /** Two-way residual, EMS, df (n − 1)(k − 1). */
  readonly msError: number;
  /** One-way within subjects, WMS, df n(k − 1). */
  readonly msWithin: number;
  readonly grandMean: number;
  /** Standard deviation of all n·k scores pooled (n·k − 1 denominator), for SEM = SD·√(1 − ICC). */
  readonly pooledSd: number;
}

/**
 * Two-way ANOVA mean squares (one observation per cell) of a complete subjects × trials table:
 * between subjects, between trials, residual, and the one-way within-subject mean square.
 * `scores` is row-major: subject i, trial j at i·trialCount + j. Sums of squares come from
 * deviations about the (compensated) means, which keeps them exact for offset data.
 * Cost: O(n·k) with two small scratch arrays (row and column means).
 * Throws StatsInputError when the shape is wrong, n < 2 or k < 2, or a cell is not finite
 * (drop or refuse incomplete subjects first: see completeSubjects).
 */
export function anovaMeanSquares(scores: Float64Array, subjectCount: number, trialCount: number): AnovaMeanSquares {
  const n = subjectCount;
  const k = trialCount;
  if (!Number.isInteger(n) || !Number.isInteger(k) || n < 2 || k < 2) {
    throw new StatsInputError(`anovaMeanSquares: need at least 2 subjects and 2 trials, got ${n} × ${k}`);
  }
  if (scores.length !== n * k) {
    throw new StatsInputError(`anovaMeanSquares: ${scores.length} scores do not fill ${n} subjects × ${k} trials`);
  }
  for (let i = 0; i < scores.length; i++) {
    if (!Number.isFinite(scores[i] as number)) {
      throw new StatsInputError(
        `anovaMeanSquares: subject ${Math.floor(i / k) + 1}, trial ${(i % k) + 1} is ${scores[i]}, not a finite score`,
      );
    }
  }
  const grandMean = compensatedSum(scores) / (n * k);
  const rowMeans = new Float64Array(n);
  const columnMeans = new Float64Array(k);
  for (let i = 0; i < n; i++) {
    let sum = 0;
    for (let j = 0; j < k; j++) sum += (scores[i * k + j] as number) - grandMean;
    rowMeans[i] = sum / k;
  }
  for (let j = 0; j < k; j++) {
    let sum = 0;
    for (let i = 0; i < n; i++) sum += (scores[i * k + j] as number) - grandMean;
    columnMeans[j] = sum / n;
  }
  // rowMeans and columnMeans hold deviations from the grand mean.
  let ssRows = 0;
  for (let i = 0; i < n; i++) ssRows += (rowMeans[i] as number) ** 2;
  ssRows *= k;
  let ssColumns = 0;
  for (let j = 0; j < k; j++) ssColumns += (columnMeans[j] as number) ** 2;
  ssColumns *= n;
  let ssError = 0;
  let ssWithin = 0;
  let ssTotal = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < k; j++) {
      const deviation = (scores[i * k + j] as number) - grandMean;
      const residual = deviation - (rowMeans[i] as number) - (columnMeans[j] as number);
      const within = deviation - (rowMeans[i] as number);
      ssError += residual * residual;
      ssWithin += within * within;
      ssTotal += deviation * deviation;
    }
  }
  return {
    subjectCount: n,
    trialCount: k,
    msRows: ssRows / (n - 1),
    msColumns: ssColumns / (k - 1),
    msError: ssError / ((n - 1) * (k - 1)),
    msWithin: ssWithin / (n * (k - 1)),
    grandMean,
    pooledSd: Math.sqrt(ssTotal / (n * k - 1)),
  };
}
