import type { ExercisePhoto } from '../domain';
import type { VerifiedBundle } from './backup-bundle';
import { EXERCISE_PHOTOS_TABLE, exercisePhotoId, type ExercisePhotoRow } from './exercise-photos';
import type { KinnoteStore } from './open-store';
import { toStoreError } from './store-error';

/**
 * How a bundle's photos meet the store's. 'merge' (restoring a backup): a programme whose incoming
 * record was written (new, or newer than the local one) takes exactly the bundle's photos, since
 * they belong to that version of its exercises; a programme whose record was the same on both sides
 * gains the bundle's photos only in places where the store has none; a programme whose local record
 * was kept (newer) keeps its own photos, which belong to its own exercises. 'replace' (a programme
 * received on the patient's phone): every programme of the bundle takes exactly the bundle's photos.
 * A bundle without photos (older backups) leaves every photo as it is.
 */
export type PhotoMode = 'merge' | 'replace';

export interface PhotoImportPlan {
  /** Programmes whose photos are replaced whole by `rows` of theirs. */
  readonly replace: ReadonlySet<string>;
  readonly rows: readonly ExercisePhotoRow[];
  readonly written: number;
  readonly removed: number;
}

const sameBytes = (a: Uint8Array, b: Uint8Array) => a.length === b.length && a.every((x, i) => x === b[i]);
const samePhoto = (a: ExercisePhoto, b: ExercisePhoto) => a.type === b.type && a.widthPx === b.widthPx && a.heightPx === b.heightPx && sameBytes(a.bytes, b.bytes);

/**
 * Decides (reads only) what the import writes to the photo table. `written`: ids of programmes whose
 * incoming record is written; `keptLocal`: ids whose differing local record was kept.
 */
export async function planPhotoImport(store: KinnoteStore, bundle: VerifiedBundle, decided: { written: ReadonlySet<string>; keptLocal: ReadonlySet<string> }, mode: PhotoMode): Promise<PhotoImportPlan> {
  const { written, keptLocal } = decided;
  const none: PhotoImportPlan = { replace: new Set(), rows: [], written: 0, removed: 0 };
  if (bundle.photos === null) return none;
  const at = store.context.now();
  const toRow = (p: ExercisePhoto): ExercisePhotoRow => ({ ...p, id: exercisePhotoId(p.programmeId, p.exercise, p.position), addedAtMs: at });
  const replace = new Set<string>();
  const rows: ExercisePhotoRow[] = [];
  let writtenCount = 0;
  let removed = 0;
  try {
    for (const programme of bundle.tables.homeProgrammes) {
      const incoming = bundle.photos.filter((p) => p.programmeId === programme.id);
      const local = (await store.db.table<ExercisePhotoRow, string>(EXERCISE_PHOTOS_TABLE).where('programmeId').equals(programme.id).toArray());
      const localById = new Map(local.map((r) => [r.id, r]));
      if (mode === 'replace' || written.has(programme.id)) {
        const incomingIds = new Set(incoming.map((p) => exercisePhotoId(p.programmeId, p.exercise, p.position)));
        const differ = incoming.filter((p) => {
          const there = localById.get(exercisePhotoId(p.programmeId, p.exercise, p.position));
          return !there || !samePhoto(there, p);
        });
        const gone = local.filter((r) => !incomingIds.has(r.id));
        if (differ.length + gone.length === 0) continue;
        replace.add(programme.id);
        rows.push(...incoming.map(toRow));
        writtenCount += differ.length;
        removed += gone.length;
        continue;
      }
      // The local record was kept (it differs): its photos belong to its own exercises.
      if (keptLocal.has(programme.id)) continue;
      // The same record on both sides: the bundle's photos fill empty places only.
      const fill = incoming.filter((p) => !localById.has(exercisePhotoId(p.programmeId, p.exercise, p.position)));
      rows.push(...fill.map(toRow));
      writtenCount += fill.length;
    }
  } catch (error) {
    throw toStoreError(error, 'reading the exercise photos before import');
  }
  return { replace, rows, written: writtenCount, removed };
}

/** Writes a plan; call inside the import's read-write transaction (which must include the photo table). */
export async function writePhotoImport(store: KinnoteStore, plan: PhotoImportPlan): Promise<void> {
  const table = store.db.table<ExercisePhotoRow, string>(EXERCISE_PHOTOS_TABLE);
  for (const programmeId of plan.replace) await table.where('programmeId').equals(programmeId).delete();
  if (plan.rows.length > 0) await table.bulkPut(plan.rows);
}
