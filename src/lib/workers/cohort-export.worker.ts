/// <reference lib="webworker" />
// Runs cohort exports off the main thread: prepares the cohort, streams each file in ≈ 64 KiB
// chunks into a Blob, posts progress after each chunk, and stops between chunks on cancel.
import { runCohortExportJob } from './cohort-export-job';
import type { CohortWorkerReply, CohortWorkerRequest } from './cohort-export-protocol';

declare const self: DedicatedWorkerGlobalScope;

const cancelled = new Set<number>();

self.onmessage = (event: MessageEvent<CohortWorkerRequest>) => {
  const message = event.data;
  if (message.type === 'cancel') {
    cancelled.add(message.jobId);
    return;
  }
  const { jobId, request } = message;
  void runCohortExportJob(
    request,
    (reply) => {
      const message: CohortWorkerReply = { ...reply, jobId };
      self.postMessage(message);
    },
    () => cancelled.has(jobId),
  ).finally(() => cancelled.delete(jobId));
};
