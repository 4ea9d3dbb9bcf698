import { weekStartOf } from './calendar';
import type { ExercisePlan } from './exercise-plan';
import type { ExerciseTick } from './home-log';
import { plannedSessionsInWeek, weeksOfPlan } from './planned-sessions';

/** Adherence in one week (Monday to Sunday). */
export interface WeekAdherence {
  /** The Monday that starts the week. */
  readonly weekStart: string;
  readonly planned: number;
  /** Sessions done in full, at most the planned number per exercise. */
  readonly done: number;
  readonly partly: number;
  readonly skipped: number;
  /** done / planned; NaN when nothing was planned. */
  readonly share: number;
}

/**
 * Adherence per week of one programme from the patient's ticks: the share of planned exercise
 * sessions done in full (common practice for home-programme adherence: completed ÷ prescribed;
 * no source). Partly done and skipped sessions are counted apart and never as done. Done is
 * capped per exercise at its planned number, so extra practice of one exercise cannot hide
 * another left undone, and no week exceeds 100 %. Weeks run Monday to Sunday from the plan's
 * first week to the week of `throughDay`; a week in progress counts planned sessions through
 * `throughDay` only, and ticks after it are ignored. Cost: O(weeks × exercises + ticks).
 */
export function weeklyAdherence(plan: ExercisePlan, programmeId: string, ticks: readonly ExerciseTick[], throughDay: string): WeekAdherence[] {
  const weeks = weeksOfPlan(plan, throughDay);
  const index = new Map(weeks.map((w, i) => [w, i]));
  const n = plan.exercises.length;
  const done = new Int32Array(weeks.length * n);
  const partly = new Int32Array(weeks.length);
  const skipped = new Int32Array(weeks.length);
  for (const t of ticks) {
    if (t.programmeId !== programmeId || t.exercise >= n || t.day > throughDay || t.day < plan.startsOn) continue;
    if (plan.endsOn !== null && t.day > plan.endsOn) continue;
    const w = index.get(weekStartOf(t.day));
    if (w === undefined) continue;
    if (t.status === 'done') done[w * n + t.exercise]!++;
    else if (t.status === 'partly') partly[w]!++;
    else skipped[w]!++;
  }
  return weeks.map((weekStart, w) => {
    const planned = plannedSessionsInWeek(plan, weekStart, throughDay);
    let doneCapped = 0;
    for (let e = 0; e < n; e++) doneCapped += Math.min(done[w * n + e]!, planned.perExercise[e]!);
    return {
      weekStart,
      planned: planned.total,
      done: doneCapped,
      partly: partly[w]!,
      skipped: skipped[w]!,
      share: planned.total > 0 ? doneCapped / planned.total : Number.NaN,
    };
  });
}

/** One week of adherence as the therapist's record holds it (from AdherenceEntry records). */
export interface RecordedWeek {
  readonly weekStart: string;
  readonly planned: number;
  readonly done: number;
  /** done / planned; NaN when nothing was planned. */
  readonly share: number;
}

interface EntryLike {
  readonly programmeId: string;
  readonly periodStart: string;
  readonly sessionsPlanned: number;
  readonly sessionsDone: number;
  readonly updatedAt: string;
  readonly deleted: boolean;
}

/**
 * Adherence per week from stored AdherenceEntry records (one patient): each entry belongs to the
 * Monday week of its periodStart. Several entries of the same programme in the same week (e.g. a
 * clinician's and the phone's) are not added up: the most recently updated one stands. Entries
 * of different programmes in one week add up. Done is capped at planned. Weeks oldest first;
 * tombstones ignored.
 */
export function adherenceByWeek(entries: readonly EntryLike[]): RecordedWeek[] {
  const latest = new Map<string, EntryLike>();
  for (const e of entries) {
    if (e.deleted) continue;
    const key = `${e.programmeId}|${weekStartOf(e.periodStart)}`;
    const seen = latest.get(key);
    if (!seen || e.updatedAt > seen.updatedAt) latest.set(key, e);
  }
  const byWeek = new Map<string, { planned: number; done: number }>();
  for (const e of latest.values()) {
    const w = weekStartOf(e.periodStart);
    const sum = byWeek.get(w) ?? { planned: 0, done: 0 };
    sum.planned += e.sessionsPlanned;
    sum.done += Math.min(e.sessionsDone, e.sessionsPlanned);
    byWeek.set(w, sum);
  }
  return [...byWeek.entries()]
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
    .map(([weekStart, s]) => ({ weekStart, planned: s.planned, done: s.done, share: s.planned > 0 ? s.done / s.planned : Number.NaN }));
}
