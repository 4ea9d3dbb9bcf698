import type { ImprovementDirection, Measure, ObservationValue, OrdinalGrade } from '../domain';

/** One number a measure yields per observation, which a change is computed on. */
export interface MeasureQuantity {
  /** 'grade', 'angle', 'value', or for Modified Tardieu 'spasticity-angle', 'r1', 'r2', 'quality'. */
  readonly key: string;
  readonly label: string;
  /** UCUM unit of the value ('deg', '1', '{grade}', '{score}', '{swings}'). */
  readonly unit: string;
  /** Unit of a change: 'grade steps' for ordinal grades (ranks), else the unit. */
  readonly changeUnit: string;
  readonly betterWhen: ImprovementDirection;
  /** Ordered grades (ranks) when the quantity is ordinal: change counts whole grade steps. */
  readonly grades: readonly OrdinalGrade[] | null;
  /** The number from a value of this measure; NaN when the value is of another kind. */
  readonly read: (value: ObservationValue) => number;
}

const cache = new Map<string, readonly MeasureQuantity[]>();

/**
 * The quantities of a catalogue measure, primary first: the grade rank of an ordinal scale (so
 * Modified Ashworth changes in grade steps, 0, 1, 1+, 2, 3, 4 → ranks 0–5); R2 − R1, R1, R2 and
 * the quality grade of the Modified Tardieu Scale, each with the direction the catalogue gives it;
 * the angle or value of the numeric kinds. Cached per measure code. Never throws.
 */
export function measureQuantities(measure: Measure): readonly MeasureQuantity[] {
  const cached = cache.get(measure.code);
  if (cached) return cached;
  let list: MeasureQuantity[];
  switch (measure.kind) {
    case 'ordinal':
      list = [
        {
          key: 'grade',
          label: measure.label,
          unit: measure.unit,
          changeUnit: 'grade steps',
          betterWhen: measure.improvement,
          grades: measure.grades,
          read: (v) => (v.kind === 'ordinal' ? v.rank : Number.NaN),
        },
      ];
      break;
    case 'tardieu': {
      const direction = measure.componentImprovement;
      const angle = (key: string, label: string, betterWhen: ImprovementDirection, pick: (v: Extract<ObservationValue, { kind: 'tardieu' }>) => number): MeasureQuantity => ({
        key,
        label: `${measure.label} ${label}`,
        unit: 'deg',
        changeUnit: 'deg',
        betterWhen,
        grades: null,
        read: (v) => (v.kind === 'tardieu' ? pick(v) : Number.NaN),
      });
      list = [
        angle('spasticity-angle', 'spasticity angle (R2 − R1)', direction.spasticityAngleDeg, (v) => v.spasticityAngleDeg),
        angle('r1', 'R1 (catch, fast stretch)', direction.r1Deg, (v) => v.r1Deg),
        angle('r2', 'R2 (passive range, slow stretch)', direction.r2Deg, (v) => v.r2Deg),
        {
          key: 'quality',
          label: `${measure.label} quality of muscle reaction`,
          unit: '{grade}',
          changeUnit: 'grade steps',
          betterWhen: direction.quality,
          grades: measure.qualityGrades,
          read: (v) => (v.kind === 'tardieu' ? v.quality : Number.NaN),
        },
      ];
      break;
    }
    default:
      list = [
        {
          key: measure.kind === 'angle' ? 'angle' : 'value',
          label: measure.label,
          unit: measure.unit,
          changeUnit: measure.unit,
          betterWhen: measure.improvement,
          grades: null,
          read: (v) => (v.kind === 'angle' ? v.angleDeg : v.kind === 'index' || v.kind === 'count' || v.kind === 'rating' ? v.value : Number.NaN),
        },
      ];
  }
  cache.set(measure.code, list);
  return list;
}
