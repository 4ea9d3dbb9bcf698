import type { HomeProgramme, RecordInput } from '../domain';
import { formatDosage, parseDosage } from './dosage-text';
import { sessionsInFullWeek, type Exercise, type ExercisePlan } from './exercise-plan';

/**
 * The stored HomeProgramme fields for a plan: each exercise becomes an item whose name is the
 * therapist's words and whose dosage is the formatDosage line; sessionsPerWeek counts exercise
 * sessions in a full week (see sessionsInFullWeek).
 */
export function planToProgrammeInput(plan: ExercisePlan, patientId: string): RecordInput<HomeProgramme> {
  return {
    patientId,
    title: plan.title,
    items: plan.exercises.map((e) => ({ name: e.name, dosage: formatDosage(e) })),
    sessionsPerWeek: sessionsInFullWeek(plan.exercises),
    startsOn: plan.startsOn,
    endsOn: plan.endsOn,
  };
}

/**
 * Reads a stored programme back as a plan. Items whose dosage is not a formatDosage line (written
 * elsewhere, e.g. the demo caseload) are listed in `unreadable` by index and come back as once a
 * day with nothing else specified, so that the form can show them for rewriting.
 */
export function programmeToPlan(programme: {
  readonly title: string;
  readonly items: readonly { readonly name: string; readonly dosage: string }[];
  readonly startsOn: string;
  readonly endsOn: string | null;
}): { plan: ExercisePlan; unreadable: number[] } {
  const unreadable: number[] = [];
  const exercises: Exercise[] = programme.items.map((item, i) => {
    const dosage = parseDosage(item.dosage);
    if (dosage) return { name: item.name, ...dosage };
    unreadable.push(i);
    return { name: item.name, holdSeconds: null, repetitions: null, sets: null, times: 1, per: 'day', caution: '' };
  });
  return { plan: { title: programme.title, exercises, startsOn: programme.startsOn, endsOn: programme.endsOn }, unreadable };
}
