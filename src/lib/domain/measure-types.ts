import type { Instrument, RomMode } from './observation';

/** Which way a change is an improvement; 'none' where neither direction is clearly better. */
export type ImprovementDirection = 'lower' | 'higher' | 'none';

/** Status label as ../shared/REFERENCES.md uses it, with the kind of copy seen (e.g. "VERIFIED (abstract)"). */
export type EvidenceStatus = `${'VERIFIED' | 'RECOMPUTED' | 'MEMORY' | 'DERIVED' | 'COMMON PRACTICE'}${string}`;

/** Which raters the published error figure compares. */
export type RaterDesign = 'same-rater' | 'different-raters' | 'unspecified';

/**
 * A published measurement-error figure. `statistic`:
 * - 'SEM': standard error of measurement;
 * - 'MDC95': minimal detectable change at 95 % (1.96·√2·SEM);
 * - 'change-for-95-percent-confidence', 'minimum-significant-difference': the papers' own names for
 *   the smallest change beyond error at 95 %, used as MDC95 equivalents.
 * A range (low < high) is what the source gives across motions or raters.
 */
export interface MeasurementErrorFigure {
  readonly statistic: 'SEM' | 'MDC95' | 'change-for-95-percent-confidence' | 'minimum-significant-difference';
  readonly low: number;
  readonly high: number;
  readonly raters: RaterDesign;
  /** Instrument the figure holds for; null when the source mixes or does not say. */
  readonly instrument: Instrument | null;
  readonly population: string;
  readonly source: string;
  readonly status: EvidenceStatus;
}

/** Published error figures, or none (then the team establishes its own with a reliability study). */
export type ErrorReference =
  | { readonly kind: 'published'; readonly figures: readonly MeasurementErrorFigure[] }
  | { readonly kind: 'none'; readonly reason: string };

/** Where a measure is taken: a muscle group, a joint motion, or the knee for the pendulum test. */
export interface MeasureSite {
  readonly code: string;
  readonly label: string;
  /** Valid range at this site when it differs from the measure's (joint motions). */
  readonly limits?: { readonly min: number; readonly max: number; readonly basis: string };
  /**
   * Where 0° is for angles at this site, in words shown beside the angle fields (Tardieu: from the
   * muscle's shortest position, except at the ankle, where 0° is the foot at 90° to the leg).
   */
  readonly angleReference?: string;
  /** Overrides the measure's error reference at this site. */
  readonly reference?: ErrorReference;
}

interface MeasureCommon {
  readonly code: string;
  readonly label: string;
  readonly description: string;
  /** UCUM unit ("deg", "1" for a ratio, "{grade}" / "{score}" / "{swings}" as UCUM annotations). */
  readonly unit: string;
  readonly improvement: ImprovementDirection;
  readonly sites: readonly MeasureSite[];
  /** Whether the observation names a side (left/right); false for measures of the whole person. */
  readonly lateral: boolean;
  readonly reference: ErrorReference;
  /** Where the definition comes from, with REFERENCES.md status. */
  readonly definitionSource: string;
  /** Shown beside results where a misreading is likely. */
  readonly caution: string | null;
  /**
   * Measures that come from one test (the pendulum test's indices) share a panel: overviews list them
   * together under its name, with `shortLabel` for each row.
   */
  readonly panel?: { readonly label: string; readonly shortLabel: string };
}

/**
 * How the visit form lays out a measure whose values are typed or tapped (absent: the measure is not
 * a row of the form; the pendulum indices come from their instrument's own flow). The form has one
 * row component per shape, so a new measure of an existing shape needs only its catalogue entry:
 * - 'grade': an ordinal grade per site and side, one button per grade with its definition;
 * - 'tardieu': R1 and R2 angles with the site's reference line and limits, and a quality grade;
 * - 'angle': one angle per site and side with the site's reference line and limits (with the
 *   measure's modes and instruments to choose, when it has them);
 * - 'rating': one whole-person rating, a button per whole number of its limits; ratings with the
 *   same `section` share one card.
 */
interface FormRowWords {
  /** The card's heading, e.g. "Modified Ashworth". */
  readonly heading: string;
  /** The measure in a field's name, e.g. "Tardieu" in "Tardieu, left ankle soleus". */
  readonly name: string;
  /** What a row's site is, above its choice: "Muscle group", "Joint motion". */
  readonly siteNoun: string;
  /** The button that adds a row: "Add a muscle group". */
  readonly addLabel: string;
}
export type GradeForm = FormRowWords & { readonly shape: 'grade' };
export type TardieuForm = FormRowWords & { readonly shape: 'tardieu'; /** Under the heading: what R1 and R2 are. */ readonly hint: string };
export type AngleForm = FormRowWords & {
  readonly shape: 'angle';
  /** A new row's mode and instrument (the measure's `modes` and `instruments` list what may be chosen). */
  readonly defaultMode?: RomMode;
  readonly defaultInstrument?: Instrument;
};
export interface RatingForm {
  readonly shape: 'rating';
  /** The card the rating sits in ("Spasms"); ratings with the same section share it. */
  readonly section: string;
  /** The rating in a field's name: "Penn spasm frequency". */
  readonly name: string;
}
export type FormLayout = GradeForm | TardieuForm | AngleForm | RatingForm;

export interface OrdinalGrade {
  readonly label: string;
  readonly rank: number;
  readonly description: string;
}

export interface OrdinalMeasure extends MeasureCommon {
  readonly kind: 'ordinal';
  /** Grades in rank order; rank = index. */
  readonly grades: readonly OrdinalGrade[];
  readonly form?: GradeForm;
}

export interface TardieuMeasure extends MeasureCommon {
  readonly kind: 'tardieu';
  /** Valid range of R1 and R2 in degrees. */
  readonly angleLimits: { readonly min: number; readonly max: number };
  readonly qualityGrades: readonly OrdinalGrade[];
  /** Direction of improvement for each part; `improvement` above is that of R2 − R1. */
  readonly componentImprovement: {
    readonly r1Deg: ImprovementDirection;
    readonly r2Deg: ImprovementDirection;
    readonly quality: ImprovementDirection;
    readonly spasticityAngleDeg: ImprovementDirection;
  };
  readonly form?: TardieuForm;
}

export interface NumericMeasure extends MeasureCommon {
  readonly kind: 'angle' | 'index' | 'count' | 'rating';
  readonly limits: { readonly min: number; readonly max: number; readonly basis: string };
  readonly integer: boolean;
  /** ROM: the observation must say active or passive and which instrument. */
  readonly modes: readonly RomMode[] | null;
  readonly instruments: readonly Instrument[] | null;
  readonly form?: AngleForm | RatingForm;
}

export type Measure = OrdinalMeasure | TardieuMeasure | NumericMeasure;
