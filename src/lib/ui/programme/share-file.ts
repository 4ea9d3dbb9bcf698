import { downloadText } from '../download';

/**
 * Offers a file through the phone's share sheet (Web Share API level 2, with files) where the
 * browser can share files, else as a download. Returns how it went; 'cancelled' when the person
 * closed the share sheet (nothing to report as an error).
 */
export async function shareOrDownload(fileName: string, text: string, title: string): Promise<'shared' | 'downloaded' | 'cancelled'> {
  const file = new File([text], fileName, { type: 'application/json' });
  const nav = navigator as Navigator & { canShare?: (data: ShareData) => boolean };
  if (typeof nav.share === 'function' && typeof nav.canShare === 'function' && nav.canShare({ files: [file] })) {
    try {
      await nav.share({ files: [file], title });
      return 'shared';
    } catch (error) {
      if ((error as DOMException)?.name === 'AbortError') return 'cancelled';
      // NotAllowedError and the like: fall back to a download rather than fail.
    }
  }
  downloadText(fileName, text, 'application/json');
  return 'downloaded';
}
