import { MEASURE_CATALOGUE, findSite, type Instrument, type Measure, type RomMode } from '$lib/domain';

/**
 * The visit form as the measure catalogue lays it out: which measures it holds (every catalogue
 * entry with a `form`), in catalogue order, and for each its shape's rows, choices and limits. The
 * form has one component per shape (grade, tardieu, angle, rating), so a new measure of an existing
 * shape needs only its catalogue entry.
 */
type FormOf<K extends Measure['kind'], S extends string> = Extract<Measure, { kind: K }> & { readonly form: Extract<NonNullable<Extract<Measure, { kind: K }>['form']>, { shape: S }> };
export type GradeMeasure = FormOf<'ordinal', 'grade'>;
export type TardieuFormMeasure = FormOf<'tardieu', 'tardieu'>;
export type AngleMeasure = FormOf<'angle' | 'index' | 'count' | 'rating', 'angle'>;
export type RatingMeasure = FormOf<'angle' | 'index' | 'count' | 'rating', 'rating'>;
/** A measure laid out as rows (one per site and side). */
export type RowMeasure = GradeMeasure | TardieuFormMeasure | AngleMeasure;
export type FormMeasure = RowMeasure | RatingMeasure;

/** One row of the form: a test of one site and side; `carried` rows come from the protocol (site and side fixed). */
interface RowBase {
  key: string;
  siteCode: string;
  side: 'left' | 'right';
  carried?: boolean;
}
export interface GradeRow extends RowBase {
  grade: string | null;
}
export interface TardieuRow extends RowBase {
  r1Deg: string;
  r2Deg: string;
  quality: number | null;
}
/** `mode` and `instrument` are null for an angle measure without modes or instruments. */
export interface AngleRow extends RowBase {
  mode: RomMode | null;
  instrument: Instrument | null;
  angleDeg: string;
}
export type FormRow = GradeRow | TardieuRow | AngleRow;

const isRating = (m: FormMeasure): m is RatingMeasure => m.form.shape === 'rating';
/** The measures the visit form lays out, in catalogue order. */
export const FORM_MEASURES: readonly FormMeasure[] = MEASURE_CATALOGUE.filter((m): m is FormMeasure => m.form !== undefined);
export const ROW_MEASURES: readonly RowMeasure[] = FORM_MEASURES.filter((m): m is RowMeasure => !isRating(m));
export const RATING_MEASURES: readonly RatingMeasure[] = FORM_MEASURES.filter(isRating);

/** The form measure with `code`, if the form lays it out. */
export function formMeasure(code: string): FormMeasure | undefined {
  return FORM_MEASURES.find((m) => m.code === code);
}
export function rowMeasure(code: string): RowMeasure | undefined {
  return ROW_MEASURES.find((m) => m.code === code);
}

/** The form's cards in order: one per row measure; consecutive ratings of the same section share one. */
export type FormSection = { readonly shape: 'rows'; readonly measure: RowMeasure } | { readonly shape: 'ratings'; readonly heading: string; readonly measures: readonly RatingMeasure[] };
export function formSections(): FormSection[] {
  const sections: FormSection[] = [];
  for (const m of FORM_MEASURES) {
    const last = sections.at(-1);
    if (!isRating(m)) sections.push({ shape: 'rows', measure: m });
    else if (last?.shape === 'ratings' && last.heading === m.form.section) sections[sections.length - 1] = { ...last, measures: [...last.measures, m] };
    else sections.push({ shape: 'ratings', heading: m.form.section, measures: [m] });
  }
  return sections;
}

/** A new row of `measure` for a site and side, without a value (a carried row keeps the protocol's mode and instrument). */
export function newRow(measure: RowMeasure, base: RowBase, carry: { mode?: RomMode | null; instrument?: Instrument | null } = {}): FormRow {
  switch (measure.form.shape) {
    case 'grade':
      return { ...base, grade: null };
    case 'tardieu':
      return { ...base, r1Deg: '', r2Deg: '', quality: null };
    default: {
      const m = measure as AngleMeasure;
      const mode = m.modes ? (carry.mode ?? m.form.defaultMode ?? m.modes[0] ?? null) : null;
      const instrument = m.instruments ? (carry.instrument ?? m.form.defaultInstrument ?? m.instruments[0] ?? null) : null;
      return { ...base, mode, instrument, angleDeg: '' };
    }
  }
}

/** Whether a row holds any value typed or tapped today. */
export function rowFilled(row: FormRow): boolean {
  if ('grade' in row) return row.grade !== null;
  if ('r1Deg' in row) return row.r1Deg !== '' || row.r2Deg !== '' || row.quality !== null;
  return row.angleDeg.trim() !== '';
}

/** A grade measure's buttons: each grade with its definition (shown on tap). */
export function gradeOptions(measure: GradeMeasure): Array<{ value: string; label: string; hint: string }> {
  return measure.grades.map((g) => ({ value: g.label, label: g.label, hint: g.description }));
}

/** The Tardieu quality buttons: each grade's rank with its definition. */
export function qualityOptions(measure: TardieuFormMeasure): Array<{ value: number; label: string; hint: string }> {
  return measure.qualityGrades.map((g) => ({ value: g.rank, label: g.label, hint: g.description }));
}

/** A rating's buttons: every whole number of its limits. */
export function ratingOptions(measure: RatingMeasure): Array<{ value: number; label: string }> {
  const { min, max } = measure.limits;
  return Array.from({ length: max - min + 1 }, (_, i) => ({ value: min + i, label: String(min + i) }));
}

/**
 * Beside an angle field: where 0° is at the site (its reference line, when it has one) and what is
 * accepted (the site's limits, else the measure's): "0° = foot at 90° to the leg. Accepted −20° to 50°".
 */
export function angleNote(measure: TardieuFormMeasure | AngleMeasure, siteCode: string): string {
  const site = findSite(measure, siteCode);
  const limits = site?.limits ?? (measure.kind === 'tardieu' ? measure.angleLimits : measure.limits);
  const accepted = `Accepted ${limits.min}° to ${limits.max}°`.replaceAll('-', '−');
  return [site?.angleReference, accepted].filter(Boolean).join('. ');
}
