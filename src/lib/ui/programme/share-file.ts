import { shareOrDownloadFile } from '../share-or-download';

/**
 * Offers a JSON file through the phone's share sheet where the browser can share files, else as a
 * download (see shareOrDownloadFile). Returns how it went; 'cancelled' when the person closed the
 * share sheet (nothing to report as an error).
 */
export async function shareOrDownload(fileName: string, text: string, title: string): Promise<'shared' | 'downloaded' | 'cancelled'> {
  const outcome = await shareOrDownloadFile(new File([text], fileName, { type: 'application/json' }), title);
  return outcome.how;
}
