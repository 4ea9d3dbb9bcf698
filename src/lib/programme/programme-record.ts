import type { HomeProgramme, RecordInput } from '../domain';
import { sessionsInFullWeek, type Exercise, type ExercisePlan } from './exercise-plan';

/**
 * The stored HomeProgramme fields for a plan: each exercise becomes an item with the therapist's
 * words, its structured dose, and its earlier free text only while it has no structured dose
 * (saving a structured dose is the therapist restructuring it); sessionsPerWeek counts planned
 * exercise sessions in a full week (see sessionsInFullWeek).
 */
export function planToProgrammeInput(plan: ExercisePlan, patientId: string): RecordInput<HomeProgramme> {
  return {
    patientId,
    title: plan.title,
    items: plan.exercises.map((e) => ({ name: e.name, dose: e.dose, dosage: e.dose === null ? e.dosageText : '' })),
    sessionsPerWeek: sessionsInFullWeek(plan.exercises),
    startsOn: plan.startsOn,
    endsOn: plan.endsOn,
  };
}

/** Reads a stored programme back as a plan, exactly: nothing is guessed for free-text dosages. */
export function programmeToPlan(programme: {
  readonly title: string;
  readonly items: readonly HomeProgramme['items'][number][];
  readonly startsOn: string;
  readonly endsOn: string | null;
}): ExercisePlan {
  const exercises: Exercise[] = programme.items.map((item) => ({ name: item.name, dose: item.dose ?? null, dosageText: item.dosage }));
  return { title: programme.title, exercises, startsOn: programme.startsOn, endsOn: programme.endsOn };
}

/** Indexes of exercises that still have only free-text dosage (the therapist may restructure them). */
export function freeTextExercises(plan: Pick<ExercisePlan, 'exercises'>): number[] {
  return plan.exercises.flatMap((e, i) => (e.dose === null ? [i] : []));
}
