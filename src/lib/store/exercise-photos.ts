import { exercisePhotoProblem, type ExercisePhoto } from '../domain';
import type { KinnoteStore } from './open-store';
import { StoreError, toStoreError } from './store-error';

/**
 * Photos of home-programme exercises, in their own table (schema v8), one row per programme,
 * exercise and position. Why not inside the HomeProgramme record: the audit keeps a full copy of a
 * record before and after every update, so ~150 KB images in the record would be copied into the
 * audit on every change of the programme's text. Photos are not records: no audit, no tombstones.
 * They travel in backups beside the records (backup-photos.ts, import-photos.ts) and to the
 * patient's phone in the programme file.
 */
export const EXERCISE_PHOTOS_TABLE = 'exercisePhotos';

export interface ExercisePhotoRow extends ExercisePhoto {
  /** `${programmeId}:${exercise}:${position}`: a photo replaces the one in its place. */
  readonly id: string;
  readonly addedAtMs: number;
}

export function exercisePhotoId(programmeId: string, exercise: number, position: number): string {
  return `${programmeId}:${exercise}:${position}`;
}

function table(store: KinnoteStore) {
  return store.db.table<ExercisePhotoRow, string>(EXERCISE_PHOTOS_TABLE);
}

function checked(photo: ExercisePhoto, exerciseCount: number, addedAtMs: number): ExercisePhotoRow {
  const problem = exercisePhotoProblem(photo, exerciseCount);
  if (problem !== null) throw new StoreError('ValidationFailed', `photo ${photo.position} of exercise ${photo.exercise + 1}: ${problem}`);
  return { ...photo, bytes: photo.bytes.slice(), id: exercisePhotoId(photo.programmeId, photo.exercise, photo.position), addedAtMs };
}

/**
 * Stores one photo in its place (replacing the one there). `exerciseCount` is the number of
 * exercises of the programme. Throws StoreError ValidationFailed for a photo that breaks a rule
 * (exercisePhotoProblem), QuotaExceeded when the device is full.
 */
export async function putExercisePhoto(store: KinnoteStore, photo: ExercisePhoto, exerciseCount: number): Promise<ExercisePhotoRow> {
  const row = checked(photo, exerciseCount, store.context.now());
  try {
    await table(store).put(row);
  } catch (error) {
    throw toStoreError(error, `saving photo ${photo.position} of exercise ${photo.exercise + 1}`);
  }
  return row;
}

/** Every photo of one programme, by exercise then position. */
export async function photosOfProgramme(store: KinnoteStore, programmeId: string): Promise<ExercisePhotoRow[]> {
  try {
    const rows = await table(store).where('programmeId').equals(programmeId).toArray();
    return rows.sort((a, b) => a.exercise - b.exercise || a.position - b.position);
  } catch (error) {
    throw toStoreError(error, 'reading the exercise photos');
  }
}

/** Removes one photo (nothing happens when there is none). */
export async function removeExercisePhoto(store: KinnoteStore, programmeId: string, exercise: number, position: number): Promise<void> {
  try {
    await table(store).delete(exercisePhotoId(programmeId, exercise, position));
  } catch (error) {
    throw toStoreError(error, 'removing the photo');
  }
}

/**
 * Replaces every photo of a programme with `photos`, in one transaction: all are checked first and
 * nothing is written when one breaks a rule (a received programme file, a re-ordered programme).
 */
export async function replaceProgrammePhotos(store: KinnoteStore, programmeId: string, photos: readonly ExercisePhoto[], exerciseCount: number): Promise<void> {
  const at = store.context.now();
  const rows = photos.map((p) => {
    if (p.programmeId !== programmeId) throw new StoreError('ValidationFailed', `photo of exercise ${p.exercise + 1} belongs to another programme`);
    return checked(p, exerciseCount, at);
  });
  const places = new Set(rows.map((r) => r.id));
  if (places.size !== rows.length) throw new StoreError('ValidationFailed', 'two photos share one place (same exercise and position)');
  try {
    await store.db.transaction('rw', [EXERCISE_PHOTOS_TABLE], async () => {
      await table(store).where('programmeId').equals(programmeId).delete();
      await table(store).bulkPut(rows);
    });
  } catch (error) {
    throw toStoreError(error, 'saving the exercise photos');
  }
}

/**
 * After the therapist removed or re-ordered exercises: `origins[i]` is the old index of what is now
 * exercise i (null for a new one). Photos follow their exercise; those of removed exercises go.
 */
export async function followExerciseOrder(store: KinnoteStore, programmeId: string, origins: readonly (number | null)[]): Promise<void> {
  const before = await photosOfProgramme(store, programmeId);
  const moved: ExercisePhoto[] = [];
  for (const row of before) {
    const now = origins.indexOf(row.exercise);
    if (now < 0) continue;
    const { id: _id, addedAtMs: _at, ...photo } = row;
    moved.push({ ...photo, exercise: now });
  }
  await replaceProgrammePhotos(store, programmeId, moved, origins.length);
}
