import * as v from 'valibot';
import { ExerciseDoseSchema, IsoDateSchema, MAX_TIMES_PER_DAY, doseIssueOf, type DoseIssue, type ExerciseDose } from '../domain';

/** HomeProgramme.sessionsPerWeek allows at most 50 (domain schema), so a full week may plan no more. */
export const MAX_SESSIONS_PER_WEEK = 50;
export const MAX_EXERCISES = 12;
export { MAX_TIMES_PER_DAY };

/**
 * One exercise, position or orthosis as the therapist writes it: what to do (their own words),
 * the structured dose, and the dosage text as written before doses were structured (kept and
 * shown while `dose` is null; empty otherwise). One of the two must say something: a dosage is
 * never made up for an exercise.
 */
export const ExerciseSchema = v.pipe(
  v.strictObject({
    name: v.pipe(v.string(), v.trim(), v.minLength(1, 'must not be empty'), v.maxLength(200, 'must be at most 200 characters')),
    dose: v.nullable(ExerciseDoseSchema),
    dosageText: v.pipe(v.string(), v.trim(), v.maxLength(200, 'must be at most 200 characters')),
  }),
  v.forward(
    v.check((e) => e.dose !== null || e.dosageText !== '', 'needs a dosage: repetitions, hold, how often, a wearing time or a note'),
    ['dose'],
  ),
);
export type Exercise = v.InferOutput<typeof ExerciseSchema>;

/** A home programme as written: title, exercises, start and (optional) end date. */
export const ExercisePlanSchema = v.pipe(
  v.strictObject({
    title: v.pipe(v.string(), v.trim(), v.minLength(1, 'must not be empty'), v.maxLength(200, 'must be at most 200 characters')),
    exercises: v.pipe(v.array(ExerciseSchema), v.minLength(1, 'needs at least one exercise'), v.maxLength(MAX_EXERCISES, `at most ${MAX_EXERCISES} exercises`)),
    startsOn: IsoDateSchema,
    endsOn: v.nullable(IsoDateSchema),
  }),
  v.forward(v.check((p) => p.endsOn === null || p.endsOn >= p.startsOn, 'must not be before the start date'), ['endsOn']),
  v.forward(
    v.check(
      (p) => sessionsInFullWeek(p.exercises) <= MAX_SESSIONS_PER_WEEK,
      `plans more than ${MAX_SESSIONS_PER_WEEK} exercise sessions a week: lower how often, or split into two programmes`,
    ),
    ['exercises'],
  ),
);
export type ExercisePlan = v.InferOutput<typeof ExercisePlanSchema>;

/** How often an exercise is planned: times on each day it is done, and days a week (7 = every day). */
export interface DoseSchedule {
  readonly timesPerDay: number;
  readonly daysPerWeek: number;
}

/**
 * How often a dose asks for the exercise, or null when it does not say (free-text dosage, or a
 * dose without times a day, days a week or "overnight"). Only what was prescribed is read:
 * days a week alone means once on each of those days; times a day alone means every day;
 * overnight means each night unless days a week says otherwise. Unscheduled exercises can be
 * ticked but never count as planned.
 */
export function doseSchedule(dose: ExerciseDose | null): DoseSchedule | null {
  if (dose === null) return null;
  const timesPerDay = dose.timesPerDay ?? (dose.daysPerWeek !== null || dose.overnight ? 1 : null);
  if (timesPerDay === null) return null;
  return { timesPerDay, daysPerWeek: dose.daysPerWeek ?? 7 };
}

/** Tick buttons a day for an exercise: one per planned time, one for an unscheduled exercise. */
export function ticksPerDay(exercise: Pick<Exercise, 'dose'>): number {
  return doseSchedule(exercise.dose)?.timesPerDay ?? 1;
}

/**
 * Planned exercise sessions in a full week. A "session" here is one exercise done once as
 * prescribed (all its sets and repetitions): an exercise twice a day is 14 sessions a week, one
 * on three days a week is 3 (a definition of this app, common practice for counting adherence).
 * Unscheduled exercises count 0.
 */
export function sessionsInFullWeek(exercises: readonly Pick<Exercise, 'dose'>[]): number {
  let total = 0;
  for (const e of exercises) {
    const s = doseSchedule(e.dose);
    if (s) total += s.timesPerDay * s.daysPerWeek;
  }
  return total;
}

/** A plan problem for the form: dot path and message (English); a dose problem also as its code, for a screen to word. */
export interface PlanIssue {
  readonly path: string;
  readonly message: string;
  readonly dose: ExerciseDoseIssue | null;
}

/** A dose problem with the exercise it is in (1 = the first), for a screen to word. */
export interface ExerciseDoseIssue extends DoseIssue {
  readonly exercise: number;
}

/**
 * The dose problem behind an issue of a plan (`exercises.N.dose…`) or a programme (`items.N.dose…`),
 * with its exercise's number; null when the issue is not a dose's.
 */
export function exerciseDoseIssue(issue: v.BaseIssue<unknown>): ExerciseDoseIssue | null {
  const dose = doseIssueOf(issue);
  if (!dose) return null;
  const keys = (issue.path ?? []).map((p) => p.key);
  const index = keys[keys.lastIndexOf('dose') - 1];
  return typeof index === 'number' ? { ...dose, exercise: index + 1 } : null;
}

/** Validates a plan; returns the cleaned plan (trimmed text) or the issues. Never throws. */
export function checkExercisePlan(candidate: unknown): { ok: true; plan: ExercisePlan } | { ok: false; issues: PlanIssue[] } {
  const result = v.safeParse(ExercisePlanSchema, candidate);
  if (result.success) return { ok: true, plan: result.output };
  return { ok: false, issues: result.issues.map((i) => ({ path: v.getDotPath(i) ?? '', message: i.message, dose: exerciseDoseIssue(i) })) };
}
