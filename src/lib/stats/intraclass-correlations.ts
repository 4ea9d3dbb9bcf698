import type { AnovaMeanSquares } from './anova-mean-squares';
import { fCdf, fQuantile } from './f-distribution';
import { StatsInputError } from './stats-input-error';

/** One ICC with its confidence interval. */
export interface IccEstimate {
  readonly value: number;
  /** [lower, upper] at the requested confidence (95 % by default); not clipped to [−1, 1]. */
  readonly ci: readonly [number, number];
  /** F test of ICC = 0 (Shrout & Fleiss 1979): F ratio, its df and the upper-tail p. */
  readonly f: number;
  readonly df1: number;
  readonly df2: number;
  readonly p: number;
}

/**
 * The six intraclass correlation forms, keyed by Shrout & Fleiss (1979) names; McGraw & Wong (1996)
 * names in brackets.
 */
export interface IntraclassCorrelations {
  /** ICC(1,1) [ICC(1)]: one-way random effects, single measure. */
  readonly '1,1': IccEstimate;
  /** ICC(2,1) [ICC(A,1)]: two-way random effects, absolute agreement, single measure. */
  readonly '2,1': IccEstimate;
  /** ICC(3,1) [ICC(C,1)]: two-way mixed effects, consistency, single measure. */
  readonly '3,1': IccEstimate;
  /** ICC(1,k) [ICC(k)]: one-way random effects, mean of k measures. */
  readonly '1,k': IccEstimate;
  /** ICC(2,k) [ICC(A,k)]: two-way random effects, absolute agreement, mean of k measures. */
  readonly '2,k': IccEstimate;
  /** ICC(3,k) [ICC(C,k)]: two-way mixed effects, consistency, mean of k measures. */
  readonly '3,k': IccEstimate;
  /** Satterthwaite df v behind the ICC(2,·) intervals (non-integer). */
  readonly satterthwaiteDf: number;
}

/** McGraw & Wong (1996) name of each Shrout & Fleiss form. */
export const mcGrawWongNames = {
  '1,1': 'ICC(1)',
  '2,1': 'ICC(A,1)',
  '3,1': 'ICC(C,1)',
  '1,k': 'ICC(k)',
  '2,k': 'ICC(A,k)',
  '3,k': 'ICC(C,k)',
} as const;

// Interval for the one-way and consistency forms from F0 = BMS/(WMS or EMS) (McGraw & Wong 1996,
// Table 7): FL = F0/F_q(df1, df2), FU = F0·F_q(df2, df1), q = 1 − α/2.
function fRatioBounds(f0: number, df1: number, df2: number, q: number): [number, number] {
  if (f0 === Number.POSITIVE_INFINITY) return [Number.POSITIVE_INFINITY, Number.POSITIVE_INFINITY];
  return [f0 / fQuantile(q, df1, df2), f0 * fQuantile(q, df2, df1)];
}

function singleFromF(f: number, k: number): number {
  return f === Number.POSITIVE_INFINITY ? 1 : (f - 1) / (f + k - 1);
}

function averageFromF(f: number): number {
  return f === Number.POSITIVE_INFINITY ? 1 : 1 - 1 / f;
}

/**
 * The six ICC forms of Shrout & Fleiss (1979) from the ANOVA mean squares, each with its
 * confidence interval from the F distribution as given by McGraw & Wong (1996):
 * - ICC(1,1) = (BMS − WMS)/(BMS + (k−1)WMS); ICC(1,k) = (BMS − WMS)/BMS; F0 = BMS/WMS on
 *   (n−1, n(k−1)) df.
 * - ICC(3,1) = (BMS − EMS)/(BMS + (k−1)EMS); ICC(3,k) = (BMS − EMS)/BMS; F0 = BMS/EMS on
 *   (n−1, (n−1)(k−1)) df.
 * - ICC(2,1) = (BMS − EMS)/(BMS + (k−1)EMS + k(JMS − EMS)/n); ICC(2,k) = (BMS − EMS)/(BMS + (JMS −
 *   EMS)/n); interval with Satterthwaite's df v = (a·JMS + b·EMS)²/((a·JMS)²/(k−1) +
 *   (b·EMS)²/((n−1)(k−1))), a = kρ̂/(n(1−ρ̂)), b = 1 + kρ̂(n−1)/(n(1−ρ̂)), ρ̂ = ICC(2,1), using F
 *   quantiles with non-integer df (the form in psych::ICC and REFERENCES.md §1d).
 * Values are not clipped: negative ICCs and negative lower bounds are reported as computed.
 * A table with no variation at all (BMS = WMS = EMS = 0) gives NaN. Zero error with subject
 * variation gives 1 with the interval [1, 1] (ICC(2,·): computed in the limit EMS → 0).
 * Throws StatsInputError for confidence outside (0, 1).
 *
 * @example
 * // Shrout & Fleiss (1979) Table 2: 6 targets × 4 judges, row-major (checked in
 * // test/reference/stats/shrout-fleiss-icc.test.ts against their Table 4).
 * const table = new Float64Array([9, 2, 5, 8, 6, 1, 3, 2, 8, 4, 6, 8, 7, 1, 2, 6, 10, 5, 6, 9, 6, 2, 4, 7]);
 * const icc = intraclassCorrelations(anovaMeanSquares(table, 6, 4));
 * icc['2,1'].value; // ≈ 0.29 (ICC(A,1)); icc['3,1'].value ≈ 0.71; icc['1,1'].value ≈ 0.17
 */
export function intraclassCorrelations(ms: AnovaMeanSquares, confidence = 0.95): IntraclassCorrelations {
  if (!(confidence > 0 && confidence < 1)) {
    throw new StatsInputError(`intraclassCorrelations: confidence ${confidence} must lie strictly between 0 and 1`);
  }
  const n = ms.subjectCount;
  const k = ms.trialCount;
  const bms = ms.msRows;
  const jms = ms.msColumns;
  const ems = ms.msError;
  const wms = ms.msWithin;
  const q = 1 - (1 - confidence) / 2;

  // One-way model.
  const dfOneWay = n * (k - 1);
  const f1 = bms / wms;
  const [fl1, fu1] = fRatioBounds(f1, n - 1, dfOneWay, q);
  const icc11 = (bms - wms) / (bms + (k - 1) * wms);
  const icc1k = (bms - wms) / bms;

  // Two-way mixed, consistency.
  const dfError = (n - 1) * (k - 1);
  const f3 = bms / ems;
  const [fl3, fu3] = fRatioBounds(f3, n - 1, dfError, q);
  const icc31 = (bms - ems) / (bms + (k - 1) * ems);
  const icc3k = (bms - ems) / bms;

  // Two-way random, absolute agreement.
  const icc21 = (bms - ems) / (bms + (k - 1) * ems + (k * (jms - ems)) / n);
  const icc2k = (bms - ems) / (bms + (jms - ems) / n);
  let lo21 = Number.NaN;
  let hi21 = Number.NaN;
  let lo2k = Number.NaN;
  let hi2k = Number.NaN;
  let v = Number.NaN;
  // Residual variance at rounding level (a table whose rows differ only by rater offsets) is
  // treated as zero: the Satterthwaite weights divide by 1 − ρ̂ and would overflow.
  if (ems <= 1e-13 * bms && bms > 0) {
    // Limit EMS → 0: v → k − 1 (or the interval collapses to 1 when raters agree exactly too).
    if (jms <= 1e-13 * bms) {
      lo21 = hi21 = lo2k = hi2k = 1;
    } else {
      v = k - 1;
      const fStar = fQuantile(q, n - 1, v);
      const fStarStar = fQuantile(q, v, n - 1);
      lo21 = (n * bms) / (fStar * k * jms + n * bms);
      hi21 = (n * fStarStar * bms) / (k * jms + n * fStarStar * bms);
      lo2k = (n * bms) / (fStar * jms + n * bms);
      hi2k = (n * fStarStar * bms) / (jms + n * fStarStar * bms);
    }
  } else if (Number.isFinite(icc21)) {
    const a = (k * icc21) / (n * (1 - icc21));
    const b = 1 + (k * icc21 * (n - 1)) / (n * (1 - icc21));
    v = (a * jms + b * ems) ** 2 / ((a * jms) ** 2 / (k - 1) + (b * ems) ** 2 / ((n - 1) * (k - 1)));
    if (v > 0 && Number.isFinite(v)) {
      const fStar = fQuantile(q, n - 1, v);
      const fStarStar = fQuantile(q, v, n - 1);
      const c = k * jms + (k * n - k - n) * ems;
      lo21 = (n * (bms - fStar * ems)) / (fStar * c + n * bms);
      hi21 = (n * (fStarStar * bms - ems)) / (c + n * fStarStar * bms);
      lo2k = (n * (bms - fStar * ems)) / (fStar * (jms - ems) + n * bms);
      hi2k = (n * (fStarStar * bms - ems)) / (jms - ems + n * fStarStar * bms);
    }
  }
  const p1 = Number.isNaN(f1) ? Number.NaN : fCdf(f1, n - 1, dfOneWay, true);
  const p3 = Number.isNaN(f3) ? Number.NaN : fCdf(f3, n - 1, dfError, true);
  const test1 = { f: f1, df1: n - 1, df2: dfOneWay, p: p1 };
  // The absolute-agreement forms are tested with the same BMS/EMS ratio as consistency.
  const test3 = { f: f3, df1: n - 1, df2: dfError, p: p3 };
  return {
    '1,1': { value: icc11, ci: [singleFromF(fl1, k), singleFromF(fu1, k)], ...test1 },
    '2,1': { value: icc21, ci: [lo21, hi21], ...test3 },
    '3,1': { value: icc31, ci: [singleFromF(fl3, k), singleFromF(fu3, k)], ...test3 },
    '1,k': { value: icc1k, ci: [averageFromF(fl1), averageFromF(fu1)], ...test1 },
    '2,k': { value: icc2k, ci: [lo2k, hi2k], ...test3 },
    '3,k': { value: icc3k, ci: [averageFromF(fl3), averageFromF(fu3)], ...test3 },
    satterthwaiteDf: v,
  };
}
