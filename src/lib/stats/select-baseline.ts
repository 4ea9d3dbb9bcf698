import { StatsInputError } from './stats-input-error';

/** Which assessment(s) a change is measured from. */
export type BaselineRule =
  | { readonly kind: 'first' }
  /** The last assessment strictly before the event (e.g. an injection) at `eventDay`. */
  | { readonly kind: 'lastBeforeEvent'; readonly eventDay: number }
  | { readonly kind: 'meanOfFirstTwo' };

/**
 * A baseline as an interval [low, high] of values (continuous) or grade ranks (ordinal). A single
 * assessment gives low = high. Two continuous assessments give their mean as low = high; two
 * ordinal grades give the range of the two ranks, never a fractional grade.
 */
export interface Baseline {
  readonly low: number;
  readonly high: number;
  /** Indices of the assessments the baseline came from. */
  readonly indices: readonly number[];
}

/**
 * Selects the baseline of one series by `rule`. `timesDay` are assessment times in days (any
 * origin), ascending; `values` the scores (continuous) or grade ranks (`ordinal`: integers).
 * For ordinal grades with 'meanOfFirstTwo' the mean of two grades is not a grade, so the baseline
 * is the pair's range: a later verdict then counts change only beyond both grades (conservative).
 * NaN values are skipped as missing. Returns null when no assessment qualifies (empty series, no
 * assessment before the event, fewer than two for 'meanOfFirstTwo').
 * Throws StatsInputError when lengths differ or times are not ascending.
 */
export function selectBaseline(
  timesDay: Float64Array,
  values: Float64Array,
  rule: BaselineRule,
  ordinal: boolean,
): Baseline | null {
  if (timesDay.length !== values.length) {
    throw new StatsInputError(`selectBaseline: ${timesDay.length} times but ${values.length} values`);
  }
  for (let i = 1; i < timesDay.length; i++) {
    if (!((timesDay[i] as number) >= (timesDay[i - 1] as number))) {
      throw new StatsInputError(`selectBaseline: times are not ascending at index ${i}`);
    }
  }
  const present: number[] = [];
  for (let i = 0; i < values.length && present.length < 2; i++) {
    if (!Number.isNaN(values[i] as number)) present.push(i);
  }
  switch (rule.kind) {
    case 'first': {
      const i = present[0];
      if (i === undefined) return null;
      return { low: values[i] as number, high: values[i] as number, indices: [i] };
    }
    case 'lastBeforeEvent': {
      for (let i = values.length - 1; i >= 0; i--) {
        if ((timesDay[i] as number) < rule.eventDay && !Number.isNaN(values[i] as number)) {
          return { low: values[i] as number, high: values[i] as number, indices: [i] };
        }
      }
      return null;
    }
    case 'meanOfFirstTwo': {
      if (present.length < 2) return null;
      const a = values[present[0] as number] as number;
      const b = values[present[1] as number] as number;
      if (ordinal) return { low: Math.min(a, b), high: Math.max(a, b), indices: present };
      const mean = (a + b) / 2;
      return { low: mean, high: mean, indices: present };
    }
  }
}
