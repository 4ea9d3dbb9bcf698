import { MAX_PHOTO_BYTES, photoEncodingAttempts, sniffPhotoType, type PhotoEncodingAttempt, type PhotoType } from '$lib/domain';
import { THERAPIST_MESSAGES as m } from './therapist-messages';

/** A photo made small enough to keep and hand over. */
export interface ShrunkPhoto {
  readonly type: PhotoType;
  readonly widthPx: number;
  readonly heightPx: number;
  readonly bytes: Uint8Array;
}

/** Why a picked file cannot become an exercise photo; the message names the file. */
export class PhotoFileError extends Error {
  override readonly name = 'PhotoFileError';
}

/** Larger files are refused before decoding: a phone camera's photo is 2–12 MB (common practice). */
export const MAX_SOURCE_FILE_BYTES = 40_000_000;
/** Decoded pixels beyond this are refused: 50 megapixels at 4 bytes each is 200 MB of memory on a phone. */
export const MAX_SOURCE_PIXELS = 50_000_000;

type Canvas2d = OffscreenCanvasRenderingContext2D | CanvasRenderingContext2D;

function canvasOf(widthPx: number, heightPx: number): { context: Canvas2d; encode: (type: string, quality: number) => Promise<Blob | null> } {
  if (typeof OffscreenCanvas === 'function') {
    const canvas = new OffscreenCanvas(widthPx, heightPx);
    const context = canvas.getContext('2d');
    if (context) return { context, encode: (type, quality) => canvas.convertToBlob({ type, quality }).catch(() => null) };
  }
  // Older Safari has no OffscreenCanvas with a 2d context.
  const canvas = document.createElement('canvas');
  canvas.width = widthPx;
  canvas.height = heightPx;
  const context = canvas.getContext('2d');
  if (!context) throw new PhotoFileError(m.noCanvas);
  return { context, encode: (type, quality) => new Promise((resolve) => canvas.toBlob(resolve, type, quality)) };
}

async function encodeAt(bitmap: ImageBitmap, attempt: PhotoEncodingAttempt, type: PhotoType): Promise<Uint8Array | null> {
  const { context, encode } = canvasOf(attempt.widthPx, attempt.heightPx);
  // White under transparent pixels: JPEG has no transparency, and a screenshot with alpha reads better on white.
  context.fillStyle = '#fff';
  context.fillRect(0, 0, attempt.widthPx, attempt.heightPx);
  context.imageSmoothingQuality = 'high';
  context.drawImage(bitmap, 0, 0, attempt.widthPx, attempt.heightPx);
  const blob = await encode(type, attempt.quality);
  if (!blob) return null;
  const bytes = new Uint8Array(await blob.arrayBuffer());
  // A browser that cannot write the type silently writes PNG instead (the canvas specification's fallback).
  return sniffPhotoType(bytes) === type ? bytes : null;
}

/**
 * Decodes a picked or captured picture and re-encodes it as WebP (JPEG where the browser cannot
 * write WebP), longest side at most 1024 px and at most MAX_PHOTO_BYTES: quality steps down, then
 * size (photoEncodingAttempts). Re-encoding also drops the camera's metadata (location, device).
 * Throws PhotoFileError naming the file for a file that is not a picture, too large, unreadable
 * in this browser, or that cannot be made small enough.
 */
export async function shrinkPhoto(file: File): Promise<ShrunkPhoto> {
  const name = `"${file.name || m.unnamedPicture}"`;
  if (file.type !== '' && !file.type.startsWith('image/')) throw new PhotoFileError(m.notAPicture(name, file.type));
  if (file.size === 0) throw new PhotoFileError(m.emptyPicture(name));
  if (file.size > MAX_SOURCE_FILE_BYTES) throw new PhotoFileError(m.pictureFileTooLarge(name, Math.round(file.size / 1e6), MAX_SOURCE_FILE_BYTES / 1e6));
  let bitmap: ImageBitmap;
  try {
    bitmap = await createImageBitmap(file);
  } catch (cause) {
    throw new PhotoFileError(m.pictureUnreadable(name, file.type || null), { cause });
  }
  try {
    if (bitmap.width * bitmap.height > MAX_SOURCE_PIXELS) {
      throw new PhotoFileError(m.pictureTooManyPixels(name, bitmap.width, bitmap.height));
    }
    const attempts = photoEncodingAttempts(bitmap.width, bitmap.height);
    for (const type of ['image/webp', 'image/jpeg'] as const) {
      for (const attempt of attempts) {
        const bytes = await encodeAt(bitmap, attempt, type);
        if (bytes === null) break; // this type cannot be written here: try the next type
        if (bytes.length <= MAX_PHOTO_BYTES) return { type, widthPx: attempt.widthPx, heightPx: attempt.heightPx, bytes };
      }
    }
    throw new PhotoFileError(m.pictureNotSmallEnough(name, MAX_PHOTO_BYTES / 1000));
  } finally {
    bitmap.close();
  }
}

/** An object URL showing stored photo bytes; revoke it when the picture leaves the screen. */
export function photoUrl(photo: { readonly type: string; readonly bytes: Uint8Array }): string {
  return URL.createObjectURL(new Blob([photo.bytes as Uint8Array<ArrayBuffer>], { type: photo.type }));
}
