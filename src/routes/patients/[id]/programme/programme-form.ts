import type { ExerciseDose } from '$lib/domain';
import type { ExercisePlan } from '$lib/programme';
import { THERAPIST_MESSAGES as m } from '$lib/ui';

/** One exercise as the form holds it: every field as typed. */
export interface ExerciseForm {
  name: string;
  reps: string;
  sets: string;
  hold: string;
  minutes: string;
  overnight: boolean;
  timesPerDay: string;
  daysPerWeek: string;
  note: string;
  /** Dosage text written before doses were structured; kept while no structured field is filled. */
  earlierText: string;
  /** Index of this exercise in the saved programme (its photos are kept under it), or null when new. */
  origin: number | null;
}

/** Everything the form holds, as the draft keeps it. */
export interface ProgrammeForm {
  title: string;
  startsOn: string;
  endsOn: string;
  exercises: ExerciseForm[];
}

/** A kept draft: the form, and the version of the programme it was started from (null: a first programme). */
export interface KeptProgramme {
  form: ProgrammeForm;
  basedOn: string | null;
}

// Every field starts empty: the form never suggests a dosage.
export function blankExercise(): ExerciseForm {
  return { name: '', reps: '', sets: '', hold: '', minutes: '', overnight: false, timesPerDay: '', daysPerWeek: '', note: '', earlierText: '', origin: null };
}
const asCount = (text: string) => (text.trim() === '' ? null : Number(text));
const text = (n: number | null) => n?.toString() ?? '';

/** The form filled from a saved programme (read as a plan); each row remembers its place for its photos. */
export function planForm(plan: ExercisePlan): ProgrammeForm {
  return {
    title: plan.title,
    startsOn: plan.startsOn,
    endsOn: plan.endsOn ?? '',
    exercises: plan.exercises.map((e, i) => ({
      name: e.name,
      reps: text(e.dose?.repetitions ?? null),
      sets: text(e.dose?.sets ?? null),
      hold: text(e.dose?.holdSeconds ?? null),
      minutes: text(e.dose?.durationMinutes ?? null),
      overnight: e.dose?.overnight ?? false,
      timesPerDay: text(e.dose?.timesPerDay ?? null),
      daysPerWeek: text(e.dose?.daysPerWeek ?? null),
      note: e.dose?.note ?? '',
      earlierText: e.dosageText,
      origin: i,
    })),
  };
}

/**
 * What the person wrote, for "is there anything to keep": the form without the rows' `origin`
 * (where a row's photos sit in the saved programme, which the page sets, not the person).
 */
export function formText(form: ProgrammeForm): string {
  return JSON.stringify({ ...form, exercises: form.exercises.map(({ origin: _origin, ...written }) => written) });
}

/** The structured dose of a form row, or null when no field was filled (the earlier text then stands). */
export function formDose(e: ExerciseForm): ExerciseDose | null {
  const dose = {
    repetitions: asCount(e.reps),
    sets: asCount(e.sets),
    holdSeconds: asCount(e.hold),
    durationMinutes: asCount(e.minutes),
    overnight: e.overnight,
    timesPerDay: asCount(e.timesPerDay),
    daysPerWeek: asCount(e.daysPerWeek),
    note: e.note,
  };
  const empty = !dose.overnight && dose.note.trim() === '' && [dose.repetitions, dose.sets, dose.holdSeconds, dose.durationMinutes, dose.timesPerDay, dose.daysPerWeek].every((x) => x === null);
  return empty ? null : dose;
}

/** The plan the form describes, for checkExercisePlan (unchecked: numbers may be NaN). */
export function formPlan(form: ProgrammeForm): unknown {
  return {
    title: form.title,
    startsOn: form.startsOn,
    endsOn: form.endsOn === '' ? null : form.endsOn,
    exercises: form.exercises.map((e) => ({ name: e.name, dose: formDose(e), dosageText: e.earlierText })),
  };
}

/** A stored draft read back, or null when it is not a programme form (it is then offered nowhere). */
export function readKeptProgramme(content: unknown): KeptProgramme | null {
  const c = content as { form?: Partial<ProgrammeForm>; basedOn?: unknown } | null;
  const f = c?.form;
  if (!f || typeof f.title !== 'string' || typeof f.startsOn !== 'string' || typeof f.endsOn !== 'string' || !Array.isArray(f.exercises)) return null;
  if (c.basedOn !== null && typeof c.basedOn !== 'string') return null;
  const blank = blankExercise();
  const exercisesKept: ExerciseForm[] = [];
  for (const e of f.exercises as unknown[]) {
    if (e === null || typeof e !== 'object') return null;
    const row = { ...blank };
    for (const key of Object.keys(blank) as (keyof ExerciseForm)[]) {
      const value = (e as Record<string, unknown>)[key];
      if (key === 'origin') {
        // The saved exercise whose photos this row carries: a place in the programme, or null (new).
        row.origin = typeof value === 'number' && Number.isInteger(value) && value >= 0 ? value : null;
        continue;
      }
      if (typeof value !== typeof blank[key]) return null;
      (row as Record<string, unknown>)[key] = value;
    }
    exercisesKept.push(row);
  }
  return { form: { title: f.title, startsOn: f.startsOn, endsOn: f.endsOn, exercises: exercisesKept }, basedOn: c.basedOn ?? null };
}

/** A plan issue's path in the form's words ("Exercise 2, hold"). */
export function describePath(path: string): string {
  const names = m.planFields;
  const exercise = /^exercises\.(\d+)\.(?:dose\.)?(\w+)$/.exec(path);
  if (exercise) return m.fieldOfExercise(Number(exercise[1]) + 1, names[exercise[2]!] ?? exercise[2]!);
  return names[path || 'programme'] ?? path;
}
