import type { HomeProgramme, Patient } from '$lib/domain';
import { photosOfProgramme, type ExercisePhotoRow, type KinnoteStore } from '$lib/store';

/** What the programme page shows: the patient (null when absent or deleted), their latest programme and its photos. */
export interface ProgrammePageData {
  readonly patient: Patient | null;
  readonly programme: HomeProgramme | null;
  readonly photos: readonly ExercisePhotoRow[];
}

/** The patient's latest programme (null: none yet) and its photos. */
export async function readLatestProgramme(store: KinnoteStore, patientId: string): Promise<Omit<ProgrammePageData, 'patient'>> {
  const programmes = (await store.homeProgrammes.byPatient(patientId)) as HomeProgramme[];
  const programme = programmes.at(-1) ?? null;
  return { programme, photos: programme ? await photosOfProgramme(store, programme.id) : [] };
}

/** Reads everything the page needs; throws the store's errors (the page shows them). */
export async function loadProgrammePage(store: KinnoteStore, patientId: string): Promise<ProgrammePageData> {
  const row = await store.patients.get(patientId);
  const patient = row && !row.deleted ? (row as Patient) : null;
  if (!patient) return { patient: null, programme: null, photos: [] };
  return { patient, ...(await readLatestProgramme(store, patientId)) };
}
