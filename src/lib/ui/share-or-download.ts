import { downloadBlob } from './download';

/** How a file left: through the share sheet, as a download (with why sharing did not take it), or not at all. */
export type ShareOutcome = { readonly how: 'shared' } | { readonly how: 'cancelled' } | { readonly how: 'downloaded'; readonly shareError: string | null };

/**
 * Offers a file through the device's share sheet (Web Share API level 2, with files) where the
 * browser can share files, else as a download. The person closing the share sheet (AbortError) is
 * 'cancelled', not an error; any other refusal of the share (NotAllowedError when the tap's user
 * activation has run out, a type the target refuses) falls back to a download and says why.
 * Never sends anything itself: the file goes only where the person sends it.
 */
export async function shareOrDownloadFile(file: File, title: string): Promise<ShareOutcome> {
  const nav = navigator as Navigator & { canShare?: (data: ShareData) => boolean };
  let shareError: string | null = null;
  if (typeof nav.share === 'function' && typeof nav.canShare === 'function' && nav.canShare({ files: [file] })) {
    try {
      await nav.share({ files: [file], title });
      return { how: 'shared' };
    } catch (error) {
      if ((error as DOMException)?.name === 'AbortError') return { how: 'cancelled' };
      shareError = error instanceof Error ? `${error.name}: ${error.message}` : String(error);
    }
  }
  downloadBlob(file.name, file);
  return { how: 'downloaded', shareError };
}

/** Whether this browser says it can share a file of this type (to name the button for what it will do). */
export function canShareFiles(type: string): boolean {
  const nav = navigator as Navigator & { canShare?: (data: ShareData) => boolean };
  if (typeof nav.share !== 'function' || typeof nav.canShare !== 'function') return false;
  try {
    return nav.canShare({ files: [new File([''], 'probe', { type })] });
  } catch {
    return false;
  }
}
