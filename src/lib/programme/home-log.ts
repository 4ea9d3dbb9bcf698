import * as v from 'valibot';
import { IdSchema, IsoDateSchema, IsoDateTimeSchema, MAX_TIMES_PER_DAY } from '../domain';
import { MAX_EXERCISES } from './exercise-plan';

export const TICK_STATUSES = ['done', 'partly', 'skipped'] as const;
export type TickStatus = (typeof TICK_STATUSES)[number];

/**
 * One tick on the patient's phone: exercise `exercise` (index in the programme) of programme
 * `programmeId`, its `slot`-th time on `day`, was done, partly done, or skipped (with a reason).
 */
export const ExerciseTickSchema = v.pipe(
  v.strictObject({
    programmeId: IdSchema,
    exercise: v.pipe(v.number(), v.integer(), v.minValue(0), v.maxValue(MAX_EXERCISES - 1)),
    day: IsoDateSchema,
    slot: v.pipe(v.number(), v.integer(), v.minValue(1), v.maxValue(MAX_TIMES_PER_DAY)),
    status: v.picklist(TICK_STATUSES),
    reason: v.nullable(v.pipe(v.string(), v.trim(), v.maxLength(200, 'must be at most 200 characters'))),
    recordedAt: IsoDateTimeSchema,
  }),
  v.forward(v.check((t) => t.status === 'skipped' || t.reason === null, 'only a skipped exercise has a reason'), ['reason']),
);
export type ExerciseTick = v.InferOutput<typeof ExerciseTickSchema>;

export const HomeLogSchema = v.strictObject({ version: v.literal(1), ticks: v.array(ExerciseTickSchema) });
export type HomeLog = v.InferOutput<typeof HomeLogSchema>;

export const EMPTY_HOME_LOG: HomeLog = { version: 1, ticks: [] };

const keyOf = (t: Pick<ExerciseTick, 'programmeId' | 'exercise' | 'day' | 'slot'>) => `${t.programmeId}|${t.exercise}|${t.day}|${t.slot}`;

/** The log with `tick` in place of any earlier tick of the same exercise, day and slot (a new log; the old is not changed). */
export function withTick(log: HomeLog, tick: ExerciseTick): HomeLog {
  const key = keyOf(tick);
  return { version: 1, ticks: [...log.ticks.filter((t) => keyOf(t) !== key), tick] };
}

/** The log without the tick of that exercise, day and slot (undo). */
export function withoutTick(log: HomeLog, at: Pick<ExerciseTick, 'programmeId' | 'exercise' | 'day' | 'slot'>): HomeLog {
  const key = keyOf(at);
  return { version: 1, ticks: log.ticks.filter((t) => keyOf(t) !== key) };
}

/** The tick of an exercise's slot on a day, if any. */
export function findTick(log: HomeLog, at: Pick<ExerciseTick, 'programmeId' | 'exercise' | 'day' | 'slot'>): ExerciseTick | undefined {
  const key = keyOf(at);
  return log.ticks.find((t) => keyOf(t) === key);
}

/** Parses a stored log; a missing or unreadable one is empty (and `damaged` says so, for a message). */
export function readHomeLog(stored: unknown): { log: HomeLog; damaged: boolean } {
  if (stored === undefined || stored === null) return { log: EMPTY_HOME_LOG, damaged: false };
  const result = v.safeParse(HomeLogSchema, stored);
  return result.success ? { log: result.output, damaged: false } : { log: EMPTY_HOME_LOG, damaged: true };
}
