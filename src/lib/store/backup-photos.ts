import * as v from 'valibot';
import { MAX_PHOTO_BYTES, PHOTO_TYPES, exercisePhotoProblem, type ExercisePhoto, type HomeProgramme } from '../domain';
import { base64ToBytes, bytesToBase64 } from './base64';
import type { StoreIssue } from './store-error';

/**
 * Exercise photos in a backup. Photos are not records (no audit, no tombstones: see
 * exercise-photos.ts), so they travel beside the bundle's tables, under `photos`, inside the
 * checksum. A bundle without `photos` (written before photos were backed up) leaves the photos of
 * the importing store as they are; an app that predates this field ignores it.
 */
export interface PortablePhoto {
  readonly programmeId: string;
  readonly patientId: string;
  readonly exercise: number;
  readonly position: number;
  readonly type: (typeof PHOTO_TYPES)[number];
  readonly widthPx: number;
  readonly heightPx: number;
  /** The encoded image, base64 (RFC 4648). */
  readonly data: string;
}

/** Base64 text of the largest photo allowed: checked before decoding, so an oversized string is never decoded. */
const MAX_PHOTO_DATA_CHARS = Math.ceil(MAX_PHOTO_BYTES / 3) * 4;

const PortablePhotoSchema = v.strictObject({
  programmeId: v.string(),
  patientId: v.string(),
  exercise: v.pipe(v.number(), v.integer()),
  position: v.pipe(v.number(), v.integer()),
  type: v.picklist(PHOTO_TYPES),
  widthPx: v.pipe(v.number(), v.integer()),
  heightPx: v.pipe(v.number(), v.integer()),
  data: v.pipe(v.string(), v.maxLength(MAX_PHOTO_DATA_CHARS, `is larger than a photo may be (${MAX_PHOTO_BYTES} bytes)`)),
});

export function toPortablePhoto(photo: ExercisePhoto): PortablePhoto {
  const { bytes, ...rest } = photo;
  return { programmeId: rest.programmeId, patientId: rest.patientId, exercise: rest.exercise, position: rest.position, type: rest.type, widthPx: rest.widthPx, heightPx: rest.heightPx, data: bytesToBase64(bytes) };
}

const placeOf = (p: { programmeId: string; exercise: number; position: number }) => `${p.programmeId}:${p.exercise}:${p.position}`;

/** Photos sorted by programme, exercise and position, so the same photos always give the same bytes. */
export function sortPhotos<T extends { programmeId: string; exercise: number; position: number }>(photos: readonly T[]): T[] {
  return [...photos].sort((a, b) => (a.programmeId < b.programmeId ? -1 : a.programmeId > b.programmeId ? 1 : a.exercise - b.exercise || a.position - b.position));
}

/**
 * Checks a bundle's `photos` against the programmes the bundle carries: each photo's programme
 * must be in the bundle (and not deleted), of the same patient, the photo must keep every photo
 * rule for that programme's exercises (exercisePhotoProblem: size ≤ MAX_PHOTO_BYTES after decoding,
 * WebP/JPEG bytes matching the declared type, sides, place), and no two photos may share a place.
 * Returns the decoded photos (null when the bundle has no `photos`) and the issues found.
 */
export function verifyBundlePhotos(raw: unknown, programmes: readonly HomeProgramme[]): { photos: ExercisePhoto[] | null; issues: StoreIssue[] } {
  if (raw === undefined) return { photos: null, issues: [] };
  if (!Array.isArray(raw)) return { photos: null, issues: [{ record: 'bundle', path: 'photos', message: 'must be a list' }] };
  const byId = new Map(programmes.map((p) => [p.id, p]));
  const issues: StoreIssue[] = [];
  const photos: ExercisePhoto[] = [];
  const places = new Set<string>();
  raw.forEach((entry: unknown, i) => {
    const record = `photos[${i}]`;
    const parsed = v.safeParse(PortablePhotoSchema, entry);
    if (!parsed.success) {
      for (const issue of parsed.issues) issues.push({ record, path: v.getDotPath(issue) ?? '', message: issue.message });
      return;
    }
    const p = parsed.output;
    const programme = byId.get(p.programmeId);
    if (!programme || programme.deleted) {
      issues.push({ record, path: 'programmeId', message: 'a photo of a programme this backup does not carry' });
      return;
    }
    if (p.patientId !== programme.patientId) {
      issues.push({ record, path: 'patientId', message: "is not the patient of the photo's programme" });
      return;
    }
    let bytes: Uint8Array;
    try {
      bytes = base64ToBytes(p.data);
    } catch {
      issues.push({ record, path: 'data', message: 'is not base64' });
      return;
    }
    const { data: _data, ...rest } = p;
    const photo: ExercisePhoto = { ...rest, bytes };
    const problem = exercisePhotoProblem(photo, programme.items.length);
    if (problem !== null) {
      issues.push({ record, path: '', message: problem });
      return;
    }
    if (places.has(placeOf(photo))) {
      issues.push({ record, path: 'position', message: 'two photos share one place (same programme, exercise and position)' });
      return;
    }
    places.add(placeOf(photo));
    photos.push(photo);
  });
  return { photos, issues };
}
