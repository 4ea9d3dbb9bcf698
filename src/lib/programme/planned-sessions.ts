import { addDays, dayNumber, weekStartOf } from './calendar';
import { doseSchedule, type Exercise, type ExercisePlan } from './exercise-plan';

/** Days of the week starting `weekStart` (a Monday) on which the plan runs, up to `throughDay` inclusive. */
export function activeDaysInWeek(plan: Pick<ExercisePlan, 'startsOn' | 'endsOn'>, weekStart: string, throughDay: string): number {
  const first = Math.max(dayNumber(weekStart), dayNumber(plan.startsOn));
  let last = Math.min(dayNumber(weekStart) + 6, dayNumber(throughDay));
  if (plan.endsOn !== null) last = Math.min(last, dayNumber(plan.endsOn));
  return Math.max(0, last - first + 1);
}

/**
 * Planned sessions of one exercise in one week, counting only days on which the plan runs up to
 * `throughDay` (so a week in progress is judged on the days so far). An exercise every day, n
 * times a day, is n per active day. One on d < 7 days a week, n times on each, is n × d in a
 * full week and pro rata in a part week, round(n × d × activeDays / 7) with halves rounded up
 * (common practice; no source): 3 days a week over 4 days plans 2, over 1 day plans 0. An
 * exercise whose dose does not say how often plans 0 (its ticks are counted apart).
 */
export function plannedSessionsOfExercise(exercise: Pick<Exercise, 'dose'>, activeDays: number): number {
  const schedule = doseSchedule(exercise.dose);
  if (activeDays <= 0 || schedule === null) return 0;
  const { timesPerDay, daysPerWeek } = schedule;
  if (daysPerWeek >= 7) return timesPerDay * activeDays;
  return activeDays >= 7 ? timesPerDay * daysPerWeek : Math.floor((timesPerDay * daysPerWeek * activeDays) / 7 + 0.5);
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
