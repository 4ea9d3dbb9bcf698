import { formatFixed } from '../domain';
import type { Baseline } from './select-baseline';
import { StatsInputError } from './stats-input-error';

/**
 * An MDC with where it came from: the team's own reliability study ('local'), a published reference
 * ('reference'), or the stated rule for ordinal grades ('rule'). chooseMdc is the one place that makes it.
 */
export interface MdcProvenance {
  /** In the measure's unit, or in grade steps for an ordinal measure. */
  readonly value: number;
  readonly source: 'local' | 'reference' | 'rule';
  /** Study name and adoption for 'local'; publication, statistic and evidence status for 'reference'; the rule for 'rule'. */
  readonly citation: string;
  /** For 'reference': first author and year, for a clinician's eyes ("Armstrong et al. 1998"). */
  readonly shortCitation?: string;
}

/** One grade of an ordinal scale: its label as shown (e.g. "1+") and its rank (0, 1, 2, …). */
export interface OrdinalGrade {
  readonly label: string;
  readonly rank: number;
}

/** The scale of a measure: continuous in a unit, or ordered grades that change in whole steps. */
export type MeasureScale =
  | { readonly kind: 'continuous'; readonly unit: string; readonly decimals?: number }
  | { readonly kind: 'ordinal'; readonly grades: readonly OrdinalGrade[] };

/** What the verdict needs about a measure, mapped in by the caller from the measure catalogue. */
export interface ChangeVerdictInput {
  /** Name of what changed (kept for callers' records; the sentence itself does not repeat it). */
  readonly measureLabel?: string;
  /** Which direction is better. */
  readonly betterWhen: 'lower' | 'higher';
  readonly scale: MeasureScale;
  /** From selectBaseline: values, or grade ranks for an ordinal scale. */
  readonly baseline: Pick<Baseline, 'low' | 'high'>;
  /** The later score (or grade rank). */
  readonly followUp: number;
  /** The MDC to judge by; null when none is known. */
  readonly mdc: MdcProvenance | null;
}

export type VerdictKind = 'improved' | 'no-change' | 'worsened' | 'no-mdc';

export interface ChangeVerdict {
  readonly verdict: VerdictKind;
  /** followUp − baseline for a single-valued baseline; NaN when the baseline is a range of two grades. */
  readonly change: number;
  /** [followUp − baseline.high, followUp − baseline.low]; both ends equal for a single-valued baseline. */
  readonly changeRange: readonly [number, number];
  /** Change in the better direction counted conservatively (against the baseline end least favourable to it). */
  readonly improvement: number;
  /** The MDC used, with its provenance; null when none was known. */
  readonly mdcUsed: MdcProvenance | null;
  /** One plain sentence for the record. */
  readonly text: string;
}

function gradeLabel(grades: readonly OrdinalGrade[], rank: number, where: string): string {
  const grade = grades.find((g) => g.rank === rank);
  if (!grade) throw new StatsInputError(`changeVerdict: ${where} rank ${rank} is not a grade of this scale`);
  return grade.label;
}

// A change that rounds to zero is written "0", never "-0" or "+0" (a 104.8° → 104.5° swing reads "0°").
function signed(value: number, decimals: number): string {
  const text = formatFixed(value, decimals);
  return Number(text) > 0 ? `+${text}` : text;
}

/**
 * Verdict on one change from baseline: improved, no change beyond measurement error, or worsened,
 * judged against the MDC (change counts when it is at least the MDC) in the measure's better
 * direction. With no MDC the verdict is 'no-mdc' ("no MDC: establish locally"), never a guess.
 * Ordinal scales change in whole grade steps between ranks (Modified Ashworth 0, 1, 1+, 2, 3, 4 →
 * ranks 0–5); a baseline given as a range of two grades (see selectBaseline) counts improvement
 * from its less favourable end and worsening from its more favourable end, so neither is overstated.
 * Throws StatsInputError for non-finite values, an MDC ≤ 0, or ranks that are not grades of the scale.
 */
export function changeVerdict(input: ChangeVerdictInput): ChangeVerdict {
  const { baseline, followUp, mdc, scale, betterWhen } = input;
  if (!Number.isFinite(baseline.low) || !Number.isFinite(baseline.high) || !Number.isFinite(followUp)) {
    throw new StatsInputError(`changeVerdict: baseline ${baseline.low}–${baseline.high} and follow-up ${followUp} must be finite`);
  }
  if (baseline.low > baseline.high) throw new StatsInputError('changeVerdict: baseline low is above baseline high');
  if (mdc !== null && (!(mdc.value > 0) || !Number.isFinite(mdc.value))) {
    throw new StatsInputError(`changeVerdict: MDC ${mdc.value} must be positive and finite`);
  }
  const changeFromHigh = followUp - baseline.high;
  const changeFromLow = followUp - baseline.low;
  // Lower is better: improvement is a fall, counted from the lower (better) baseline end.
  const improvement = betterWhen === 'lower' ? baseline.low - followUp : followUp - baseline.high;
  const worsening = betterWhen === 'lower' ? followUp - baseline.high : baseline.low - followUp;

  let fromText: string;
  let atText: string;
  let changeText: string;
  let mdcText = '';
  if (scale.kind === 'ordinal') {
    const lowLabel = gradeLabel(scale.grades, baseline.low, 'baseline');
    const highLabel = gradeLabel(scale.grades, baseline.high, 'baseline');
    const followLabel = gradeLabel(scale.grades, followUp, 'follow-up');
    const steps = (n: number): string => `${signed(n, 0)} grade step${Math.abs(n) === 1 ? '' : 's'}`;
    fromText =
      baseline.low === baseline.high
        ? `from grade ${lowLabel} to grade ${followLabel}`
        : `from grades ${lowLabel} and ${highLabel} at baseline to grade ${followLabel}`;
    atText = `at grade ${followLabel}`;
    changeText = changeFromHigh === changeFromLow ? steps(changeFromHigh) : `${steps(changeFromHigh)} to ${steps(changeFromLow)}`;
    if (mdc) mdcText = `${mdc.value} grade step${mdc.value === 1 ? '' : 's'}`;
  } else {
    const decimals = scale.decimals ?? 1;
    // A degree sign sits on its number (20°); a word unit is spaced (20 deg).
    const unit = scale.unit === '°' ? '°' : scale.unit ? ` ${scale.unit}` : '';
    atText = `at ${followUp.toFixed(decimals)}${unit}`;
    fromText = `from ${baseline.low.toFixed(decimals)}${unit} to ${followUp.toFixed(decimals)}${unit}`;
    changeText = `${signed(changeFromHigh, decimals)}${unit}`;
    if (mdc) mdcText = `${+mdc.value.toFixed(2)}${unit}`; // never rounded up to a whole degree
  }
  let verdict: VerdictKind;
  let text: string;
  // One plain sentence; where the MDC comes from is a separate, quieter line (mdcSourceLine).
  if (mdc === null) {
    verdict = 'no-mdc';
    text =
      changeFromHigh === 0 && changeFromLow === 0
        ? `Unchanged ${atText}.`
        : `Changed ${fromText} (${changeText}); with no MDC known, whether this exceeds measurement error cannot be judged.`;
  } else if (improvement >= mdc.value) {
    verdict = 'improved';
    text = `Improved ${fromText} (${changeText}), beyond measurement error (MDC ${mdcText}).`;
  } else if (worsening >= mdc.value) {
    verdict = 'worsened';
    text = `Worse ${fromText} (${changeText}), beyond measurement error (MDC ${mdcText}).`;
  } else {
    verdict = 'no-change';
    text = `No change beyond measurement error ${fromText} (${changeText}; MDC ${mdcText}).`;
  }
  return {
    verdict,
    change: changeFromHigh === changeFromLow ? changeFromHigh : Number.NaN,
    changeRange: [changeFromHigh, changeFromLow],
    improvement,
    mdcUsed: mdc,
    text,
  };
}
