import type { BackupProgress, KinnoteStore } from '../store';
import type { BackupJobReply } from './backup-stream-job';

export interface StreamedBackupJob {
  readonly result: Promise<{ blob: Blob; checksum: string; records: number }>;
  /** Stops between pages; `result` then rejects with code 'Aborted'. The store is only read. */
  cancel(): void;
}

export class BackupJobError extends Error {
  constructor(
    message: string,
    readonly code: string,
  ) {
    super(message);
  }
}

/**
 * Starts a streamed backup of the clinical records in a Web Worker (one per job, ended when it
 * settles). No main-thread fallback: loading the job in the page, statically or lazily, made the
 * bundler split the first screen's store chunk in two (1.3 KB gzip more in the first load for the
 * same code); where no worker starts, the result says so and the encrypted backup still works.
 */
export function startStreamedBackup(store: KinnoteStore, source: string, onProgress: (p: BackupProgress) => void): StreamedBackupJob {
  let settle!: { resolve: (r: Awaited<StreamedBackupJob['result']>) => void; reject: (e: Error) => void };
  const result = new Promise<Awaited<StreamedBackupJob['result']>>((resolve, reject) => (settle = { resolve, reject }));
  let worker: Worker | null = null;
  try {
    worker = typeof Worker === 'undefined' ? null : new Worker(new URL('./backup-stream.worker.ts', import.meta.url), { type: 'module' });
  } catch {
    worker = null;
  }
  const handle = (reply: BackupJobReply) => {
    if (reply.type === 'progress') return onProgress(reply.progress);
    worker?.terminate();
    if (reply.type === 'done') settle.resolve({ blob: reply.blob, checksum: reply.checksum, records: reply.records });
    else settle.reject(new BackupJobError(reply.message, reply.code));
  };
  if (worker) {
    worker.onmessage = (event: MessageEvent<BackupJobReply>) => handle(event.data);
    worker.onerror = (event) => handle({ type: 'error', code: 'Unknown', message: event.message || 'the backup worker failed' });
    worker.postMessage({ type: 'start', dbName: store.db.name, source });
    return { result, cancel: () => worker?.postMessage({ type: 'cancel' }) };
  }
  handle({ type: 'error', code: 'Unknown', message: 'this browser cannot run the backup in the background (no Web Worker); use the encrypted backup' });
  return { result, cancel: () => undefined };
}
