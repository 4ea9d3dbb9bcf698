import type { HomeProgramme } from '$lib/domain';
import { planToProgrammeInput, type ExercisePlan } from '$lib/programme';
import { followExerciseOrder, photosOfProgramme, type ExercisePhotoRow, type KinnoteStore } from '$lib/store';

/** Where a save starts from: the programme as this form read it, and the form's rows' places. */
export interface ProgrammeSaveContext {
  readonly patientId: string;
  /** The saved programme the form was filled from (null: a first programme). */
  readonly programme: HomeProgramme | null;
  /** Its version (`updatedAt`) when the form was filled; the write is refused if it changed since. */
  readonly basedOn: string | null;
  /** This tab's draft, removed in the write's own transaction. */
  readonly draftId: string | null;
  /** For each row of the form, its place in the saved programme (null: new), so photos follow their exercise. */
  readonly origins: readonly (number | null)[];
  readonly photos: readonly ExercisePhotoRow[];
}

/**
 * Writes a checked plan as the patient's programme, then moves photos after exercises that were
 * removed or moved. Refused (nothing written; the store's error) when another tab or device changed
 * the programme since `basedOn`, or created the first one meanwhile.
 */
export async function saveProgramme(store: KinnoteStore, plan: ExercisePlan, at: ProgrammeSaveContext): Promise<{ programme: HomeProgramme; photos: ExercisePhotoRow[] }> {
  const input = planToProgrammeInput(plan, at.patientId);
  const written = (at.basedOn !== null && at.programme
    ? await store.homeProgrammes.update(at.programme.id, input, { expectedUpdatedAt: at.basedOn, draftId: at.draftId })
    : await store.homeProgrammes.create(input, { firstForPatient: true, draftId: at.draftId })) as HomeProgramme;
  const { origins, photos } = at;
  if (origins.some((o, i) => o !== i) || photos.some((p) => p.exercise >= origins.length)) await followExerciseOrder(store, written.id, origins);
  return { programme: written, photos: await photosOfProgramme(store, written.id) };
}
