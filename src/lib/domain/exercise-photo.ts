/**
 * Photos of home-programme exercises: the rules every layer shares (how many, how big, which
 * encodings). Pure: the page does the decoding and encoding (canvas), the store keeps the bytes.
 */

/** At most this many photos per exercise (a start and an end position, say). */
export const MAX_PHOTOS_PER_EXERCISE = 2;
/** Encoded size limit of one photo, in bytes ("about 150 KB"; 150,000 rather than 150 KiB: the smaller reading). */
export const MAX_PHOTO_BYTES = 150_000;
/** Longest side of a stored photo: sharp on a 1024 px tablet and on a phone held either way (common practice). */
export const PHOTO_LONGEST_SIDE_PX = 1024;
/** Smallest longest side the encoder steps down to before it gives up; below this an exercise is hard to make out. */
export const PHOTO_MIN_LONGEST_SIDE_PX = 480;
/** Encodings a stored photo may have: WebP where the browser encodes it, JPEG where it does not (Safari). */
export const PHOTO_TYPES = ['image/webp', 'image/jpeg'] as const;
export type PhotoType = (typeof PHOTO_TYPES)[number];

/** One stored photo of one exercise. `position` is 1 or 2 (the order the patient sees them in). */
export interface ExercisePhoto {
  readonly programmeId: string;
  readonly patientId: string;
  /** Index of the exercise in its programme's items. */
  readonly exercise: number;
  readonly position: number;
  readonly type: PhotoType;
  readonly widthPx: number;
  readonly heightPx: number;
  readonly bytes: Uint8Array;
}

/**
 * The encoding of an image from its first bytes ("magic numbers"): WebP is a RIFF container whose
 * form type is "WEBP" (RFC 9649 §2.5); JPEG starts with the SOI marker FF D8 followed by another
 * marker FF (ITU T.81 Annex B). Returns null for anything else.
 */
export function sniffPhotoType(bytes: Uint8Array): PhotoType | null {
  const ascii = (from: number, to: number) => String.fromCharCode(...bytes.subarray(from, to));
  if (bytes.length >= 12 && ascii(0, 4) === 'RIFF' && ascii(8, 12) === 'WEBP') return 'image/webp';
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'image/jpeg';
  return null;
}

/**
 * Why a photo may not be stored or handed over, or null when it may. Checks the exercise and
 * position numbers, the declared type against the bytes, the size limit and the dimensions.
 */
export function exercisePhotoProblem(photo: Omit<ExercisePhoto, 'programmeId' | 'patientId'>, exerciseCount: number): string | null {
  if (!Number.isInteger(photo.exercise) || photo.exercise < 0 || photo.exercise >= exerciseCount) return `exercise ${photo.exercise + 1} does not exist in this programme`;
  if (!Number.isInteger(photo.position) || photo.position < 1 || photo.position > MAX_PHOTOS_PER_EXERCISE) return `photo position must be 1 to ${MAX_PHOTOS_PER_EXERCISE}`;
  if (!(photo.bytes instanceof Uint8Array) || photo.bytes.length === 0) return 'the photo is empty';
  if (photo.bytes.length > MAX_PHOTO_BYTES) return `the photo is ${photo.bytes.length} bytes; at most ${MAX_PHOTO_BYTES} are allowed`;
  const sniffed = sniffPhotoType(photo.bytes);
  if (sniffed === null) return 'the photo is neither WebP nor JPEG';
  if (sniffed !== photo.type) return `the photo says ${photo.type} but is ${sniffed}`;
  for (const side of [photo.widthPx, photo.heightPx]) {
    if (!Number.isInteger(side) || side < 1 || side > PHOTO_LONGEST_SIDE_PX) return `photo sides must be 1 to ${PHOTO_LONGEST_SIDE_PX} px`;
  }
  return null;
}

/** Width and height scaled down (never up) so that the longer side is at most `longestSidePx`; rounded, at least 1. */
export function fitWithin(widthPx: number, heightPx: number, longestSidePx: number): { widthPx: number; heightPx: number } {
  if (!(widthPx > 0 && heightPx > 0 && longestSidePx > 0)) throw new RangeError('sides must be positive');
  const scale = Math.min(1, longestSidePx / Math.max(widthPx, heightPx));
  return { widthPx: Math.max(1, Math.round(widthPx * scale)), heightPx: Math.max(1, Math.round(heightPx * scale)) };
}

/** One try of the encoder: draw at this size, encode at this quality (0..1). */
export interface PhotoEncodingAttempt {
  readonly widthPx: number;
  readonly heightPx: number;
  readonly quality: number;
}

/** Qualities tried at each size, best first (common practice: WebP/JPEG look fine for a photo of a person down to ~0.5). */
const QUALITY_STEPS = [0.82, 0.72, 0.62, 0.52] as const;
/** Each further size is this fraction of the previous longest side. */
const SIZE_STEP = 0.8;

/**
 * The encoder's ladder for a decoded image of `widthPx` × `heightPx`: at the largest allowed size,
 * quality steps down; then the size steps down by 0.8 and the qualities are tried again, until the
 * longest side would fall below PHOTO_MIN_LONGEST_SIDE_PX (or below the image's own longest side
 * at the start, for small images). The caller encodes each in turn and keeps the first that fits
 * MAX_PHOTO_BYTES.
 */
export function photoEncodingAttempts(widthPx: number, heightPx: number): PhotoEncodingAttempt[] {
  const start = fitWithin(widthPx, heightPx, PHOTO_LONGEST_SIDE_PX);
  const startLongest = Math.max(start.widthPx, start.heightPx);
  const floor = Math.min(startLongest, PHOTO_MIN_LONGEST_SIDE_PX);
  const attempts: PhotoEncodingAttempt[] = [];
  for (let longest = startLongest; longest >= floor; longest = Math.floor(longest * SIZE_STEP)) {
    const size = fitWithin(widthPx, heightPx, longest);
    for (const quality of QUALITY_STEPS) attempts.push({ ...size, quality });
  }
  return attempts;
}
