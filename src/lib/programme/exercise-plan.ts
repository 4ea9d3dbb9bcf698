import * as v from 'valibot';
import { IsoDateSchema } from '../domain';

export const FREQUENCY_PERIODS = ['day', 'week'] as const;
export type FrequencyPeriod = (typeof FREQUENCY_PERIODS)[number];

/** Most times a day an exercise can be asked for; per week, at most once a day (7). */
export const MAX_TIMES_PER_DAY = 6;
export const MAX_TIMES_PER_WEEK = 7;
/** HomeProgramme.sessionsPerWeek allows at most 50 (domain schema), so a full week may plan no more. */
export const MAX_SESSIONS_PER_WEEK = 50;
export const MAX_EXERCISES = 12;
export const MAX_CAUTION_LENGTH = 100;

const count = (max: number) => v.nullable(v.pipe(v.number(), v.integer('must be a whole number'), v.minValue(1, 'must be at least 1'), v.maxValue(max, `must be at most ${max}`)));
const oneLine = (max: number) =>
  v.pipe(v.string(), v.trim(), v.maxLength(max, `must be at most ${max} characters`), v.regex(/^[^\n\r·]*$/, 'must be one line without "·"'));

/**
 * One exercise or position as the therapist writes it: what to do (their own words), hold time,
 * repetitions, sets, how often, and a caution. Null means "not specified" for that exercise.
 */
export const ExerciseSchema = v.pipe(
  v.strictObject({
    name: v.pipe(v.string(), v.trim(), v.minLength(1, 'must not be empty'), v.maxLength(200, 'must be at most 200 characters')),
    holdSeconds: count(600),
    repetitions: count(100),
    sets: count(20),
    times: v.pipe(v.number(), v.integer('must be a whole number'), v.minValue(1, 'must be at least 1')),
    per: v.picklist(FREQUENCY_PERIODS),
    caution: oneLine(MAX_CAUTION_LENGTH),
  }),
  v.forward(
    v.check((e) => e.times <= (e.per === 'day' ? MAX_TIMES_PER_DAY : MAX_TIMES_PER_WEEK), `must be at most ${MAX_TIMES_PER_DAY} a day or ${MAX_TIMES_PER_WEEK} a week`),
    ['times'],
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

/**
 * Planned exercise sessions in a full week. A "session" here is one exercise done once as
 * prescribed (all its sets and repetitions): an exercise twice a day is 14 sessions a week, one
 * three times a week is 3 (a definition of this app, common practice for counting adherence).
 */
export function sessionsInFullWeek(exercises: readonly Pick<Exercise, 'times' | 'per'>[]): number {
  let total = 0;
  for (const e of exercises) total += e.per === 'day' ? e.times * 7 : e.times;
  return total;
}

/** A plan problem for the form: dot path and message. */
export interface PlanIssue {
  readonly path: string;
  readonly message: string;
}

/** Validates a plan; returns the cleaned plan (trimmed text) or the issues. Never throws. */
export function checkExercisePlan(candidate: unknown): { ok: true; plan: ExercisePlan } | { ok: false; issues: PlanIssue[] } {
  const result = v.safeParse(ExercisePlanSchema, candidate);
  if (result.success) return { ok: true, plan: result.output };
  return { ok: false, issues: result.issues.map((i) => ({ path: v.getDotPath(i) ?? '', message: i.message })) };
}
