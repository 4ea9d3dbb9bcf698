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
 * Tombstoned programmes are left out. With `receivedOn` (the day the phone got its first
 * programme) no plan starts before it: the patient could not tick days before the phone had the
 * programme, so those days are neither shown nor counted as missed.
 */
export function followedPlans(programmes: readonly ProgrammeLike[], receivedOn: string | null = null): FollowedPlan[] {
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
    const startsOn = receivedOn !== null && receivedOn > plan.startsOn ? receivedOn : plan.startsOn;
    if (endsOn !== null && endsOn < startsOn) return;
    out.push({ programmeId: p.id, plan: { ...plan, startsOn, endsOn } });
  });
  return out;
}
