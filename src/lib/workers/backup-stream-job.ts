import { streamBackup, type BackupProgress, type KinnoteStore } from '../store';

/** What a streamed backup job posts back from its worker. */
export type BackupJobReply =
  | { readonly type: 'progress'; readonly progress: BackupProgress }
  | { readonly type: 'done'; readonly blob: Blob; readonly checksum: string; readonly records: number }
  | { readonly type: 'error'; readonly code: string; readonly message: string };

export type BackupJobRequest = { readonly type: 'start'; readonly dbName: string; readonly source: string } | { readonly type: 'cancel' };

/** Pieces are joined into Blob parts of about this many characters (Chromium keeps large blobs out of the JS heap). */
const PART_CHARS = 4_000_000;

/**
 * Runs a streamed backup of the clinical records (names and notes left out: an encrypted backup is
 * sealed whole by AES-GCM and stays on the in-memory path) and returns the file as a Blob.
 */
export async function runBackupJob(store: KinnoteStore, source: string, signal: AbortSignal, reply: (r: BackupJobReply) => void): Promise<void> {
  const parts: Blob[] = [];
  let pending: string[] = [];
  let pendingChars = 0;
  try {
    const out = await streamBackup(store, {
      protectedContent: 'omit',
      source,
      signal,
      write: (piece) => {
        pending.push(piece);
        pendingChars += piece.length;
        if (pendingChars < PART_CHARS) return;
        parts.push(new Blob(pending));
        pending = [];
        pendingChars = 0;
      },
      onProgress: (progress) => reply({ type: 'progress', progress }),
    });
    const blob = new Blob([out.head, ...parts, ...pending, out.tail], { type: 'application/json' });
    reply({ type: 'done', blob, checksum: out.checksum, records: out.records });
  } catch (error) {
    const e = error as { code?: unknown; message?: unknown };
    reply({ type: 'error', code: typeof e.code === 'string' ? e.code : 'Unknown', message: typeof e.message === 'string' ? e.message : String(error) });
  }
}
