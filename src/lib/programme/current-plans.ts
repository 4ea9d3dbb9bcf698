import type { HomeProgramme } from '../domain';
import { addDays } from './calendar';
import type { ExercisePlan } from './exercise-plan';
import { programmeToPlan } from './programme-record';

interface ProgrammeLike {
  readonly id: string;
  readonly createdAt: string;
  readonly deleted: boolean;
  readonly title: string;
  readonly items: HomeProgramme['items'];
  readonly startsOn: string;
  readonly endsOn: string | null;
}

/** A programme as the phone follows it: its plan, with the end brought forward when a newer programme took over. */
export interface FollowedPlan {
  readonly programmeId: string;
  readonly plan: ExercisePlan;
}

/**
 * The plans a patient follows, oldest first. A programme handed over later replaces an earlier one
 * from the later one's start date: the earlier one then ends the day before (or never runs, when
 * the later one starts first). Order is creation order (ids and createdAt are time-ordered).
 * Tombstoned programmes are left out.
 */
export function followedPlans(programmes: readonly ProgrammeLike[]): FollowedPlan[] {
  const live = programmes.filter((p) => !p.deleted).sort((a, b) => (a.createdAt < b.createdAt ? -1 : a.createdAt > b.createdAt ? 1 : a.id < b.id ? -1 : 1));
  const out: FollowedPlan[] = [];
  live.forEach((p, i) => {
    const plan = programmeToPlan(p);
    const next = live[i + 1];
    let endsOn = plan.endsOn;
    if (next) {
      const dayBefore = addDays(next.startsOn, -1);
      if (endsOn === null || dayBefore < endsOn) endsOn = dayBefore;
    }
    out.push({ programmeId: p.id, plan: { ...plan, endsOn } });
  });
  return out;
}
