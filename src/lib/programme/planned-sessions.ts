import { addDays, dayNumber, weekStartOf } from './calendar';
import type { Exercise, ExercisePlan } from './exercise-plan';

/** Days of the week starting `weekStart` (a Monday) on which the plan runs, up to `throughDay` inclusive. */
export function activeDaysInWeek(plan: Pick<ExercisePlan, 'startsOn' | 'endsOn'>, weekStart: string, throughDay: string): number {
  const first = Math.max(dayNumber(weekStart), dayNumber(plan.startsOn));
  let last = Math.min(dayNumber(weekStart) + 6, dayNumber(throughDay));
  if (plan.endsOn !== null) last = Math.min(last, dayNumber(plan.endsOn));
  return Math.max(0, last - first + 1);
}

/**
 * Planned sessions of one exercise in one week, counting only days on which the plan runs up to
 * `throughDay` (so a week in progress is judged on the days so far). An exercise n times a day is
 * n per active day. One n times a week is n in a full week and pro rata in a part week,
 * round(n × activeDays / 7) with halves rounded up (common practice; no source): 3 a week over
 * 4 days plans 2, over 1 day plans 0.
 */
export function plannedSessionsOfExercise(exercise: Pick<Exercise, 'times' | 'per'>, activeDays: number): number {
  if (activeDays <= 0) return 0;
  if (exercise.per === 'day') return exercise.times * activeDays;
  return activeDays >= 7 ? exercise.times : Math.floor((exercise.times * activeDays) / 7 + 0.5);
}

/** Planned sessions of every exercise in the week (index-aligned with plan.exercises), and their sum. */
export function plannedSessionsInWeek(plan: ExercisePlan, weekStart: string, throughDay: string): { perExercise: number[]; total: number } {
  const days = activeDaysInWeek(plan, weekStart, throughDay);
  const perExercise = plan.exercises.map((e) => plannedSessionsOfExercise(e, days));
  return { perExercise, total: perExercise.reduce((a, b) => a + b, 0) };
}

/** True when the plan runs on `day`. */
export function planRunsOn(plan: Pick<ExercisePlan, 'startsOn' | 'endsOn'>, day: string): boolean {
  return day >= plan.startsOn && (plan.endsOn === null || day <= plan.endsOn);
}

/** The Mondays of every week from the plan's start to `throughDay` (or its end, if earlier), oldest first. */
export function weeksOfPlan(plan: Pick<ExercisePlan, 'startsOn' | 'endsOn'>, throughDay: string): string[] {
  const last = plan.endsOn !== null && plan.endsOn < throughDay ? plan.endsOn : throughDay;
  if (last < plan.startsOn) return [];
  const weeks: string[] = [];
  for (let w = weekStartOf(plan.startsOn); w <= last; w = addDays(w, 7)) weeks.push(w);
  return weeks;
}
