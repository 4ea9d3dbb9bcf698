/// <reference lib="webworker" />
// The streamed backup off the page's thread: opens its own connection to the device's database
// (read only: nothing here writes) and posts progress and the finished Blob.
import { openStore } from '../store';
import { runBackupJob, type BackupJobReply, type BackupJobRequest } from './backup-stream-job';

let cancel: AbortController | null = null;
const post = (reply: BackupJobReply) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(reply);

self.onmessage = async (event: MessageEvent<BackupJobRequest>) => {
  const request = event.data;
  if (request.type === 'cancel') {
    cancel?.abort();
    return;
  }
  cancel = new AbortController();
  try {
    const store = await openStore({ name: request.dbName, idleTimeoutMs: null });
    try {
      await runBackupJob(store, request.source, cancel.signal, post);
    } finally {
      store.close();
    }
  } catch (error) {
    post({ type: 'error', code: (error as { code?: string }).code ?? 'Unknown', message: (error as Error).message });
  }
};
