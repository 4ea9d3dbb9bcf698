import {
  CohortExportFailure,
  type CohortExportCallbacks,
  type CohortExportJob,
  type CohortExportPrepared,
  type CohortExportRequest,
  type CohortExportResult,
  type CohortJobReply,
  type CohortWorkerReply,
  type CohortWorkerRequest,
} from './cohort-export-protocol';
import { runCohortExportJob } from './cohort-export-job';
import { workerWithFallback } from './worker-with-fallback';

let nextJobId = 1;
const jobs = new Map<number, (reply: CohortWorkerReply) => void>();

const exportWorker = workerWithFallback<CohortWorkerReply>(() => new Worker(new URL('./cohort-export.worker.ts', import.meta.url), { type: 'module' }), {
  reply: (reply) => jobs.get(reply.jobId)?.(reply),
  // A broken worker fails its jobs; the next export runs on the main thread.
  broken: (message) => {
    for (const [jobId, handle] of jobs) handle({ type: 'error', jobId, message: message || 'the export worker failed', reason: 'failed', field: null });
    jobs.clear();
  },
});

/**
 * Starts a cohort export in a Web Worker (falling back to the main thread where workers are
 * unavailable or broken). The page gets `onPrepared` (live count, summary per measure, files to
 * come), then `onProgress` after every chunk; `result` resolves with a Blob per file, or rejects
 * with CohortExportFailure ('cancelled', 'refused' with the field, or 'failed'). `cancel()` stops
 * the job between chunks.
 */
export function startCohortExport(request: CohortExportRequest, callbacks: CohortExportCallbacks = {}): CohortExportJob {
  const jobId = nextJobId++;
  let cancelled = false;
  let prepared: CohortExportPrepared | null = null;
  let settle!: { resolve: (r: CohortExportResult) => void; reject: (e: Error) => void };
  const result = new Promise<CohortExportResult>((resolve, reject) => (settle = { resolve, reject }));
  const target = exportWorker();
  const ranOn = target ? 'worker' : 'main-thread';
  const handle = (reply: CohortJobReply) => {
    switch (reply.type) {
      case 'prepared':
        prepared = reply.prepared;
        callbacks.onPrepared?.(reply.prepared);
        return;
      case 'progress':
        callbacks.onProgress?.(reply.progress);
        return;
      case 'done':
        jobs.delete(jobId);
        if (prepared) settle.resolve({ ...prepared, fileResults: reply.fileResults, ranOn });
        else settle.reject(new CohortExportFailure('the export ended before it was prepared', 'failed'));
        return;
      case 'error':
        jobs.delete(jobId);
        settle.reject(new CohortExportFailure(reply.message, reply.reason, reply.field));
    }
  };
  if (target) {
    jobs.set(jobId, handle);
    const message: CohortWorkerRequest = { type: 'start', jobId, request };
    target.postMessage(message);
  } else {
    void runCohortExportJob(request, handle, () => cancelled);
  }
  return {
    result,
    cancel() {
      if (cancelled) return;
      cancelled = true;
      if (target && jobs.has(jobId)) {
        const message: CohortWorkerRequest = { type: 'cancel', jobId };
        target.postMessage(message);
      }
    },
  };
}

