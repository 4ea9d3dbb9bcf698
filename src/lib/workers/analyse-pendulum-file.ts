import { parseAndAnalysePendulumCsv, PendulumInputError } from '$lib/pendulum';
import type { PendulumReply, PendulumRequest, PendulumResult } from './pendulum-protocol';
import { workerWithFallback } from './worker-with-fallback';

/** A refusal from the engine (file, row, reason), or a failure of the worker itself. */
export class PendulumAnalysisError extends Error {
  override readonly name = 'PendulumAnalysisError';
  constructor(
    message: string,
    readonly refused: boolean,
  ) {
    super(message);
  }
}

let nextId = 1;
const pending = new Map<number, { resolve: (a: PendulumResult) => void; reject: (e: Error) => void }>();

const pendulumWorker = workerWithFallback<PendulumReply>(() => new Worker(new URL('./pendulum.worker.ts', import.meta.url), { type: 'module' }), {
  reply: (reply) => {
    const waiter = pending.get(reply.id);
    if (!waiter) return;
    pending.delete(reply.id);
    if (reply.ok) waiter.resolve({ analysis: reply.analysis, raw: reply.raw });
    else waiter.reject(new PendulumAnalysisError(reply.message, reply.refused));
  },
  // A broken worker fails its pending jobs; the next call falls back to the main thread.
  broken: (message) => {
    for (const [, waiter] of pending) waiter.reject(new PendulumAnalysisError(message || 'the analysis worker failed', false));
    pending.clear();
  },
});

/**
 * Analyses a pendulum recording (CSV text) in a Web Worker; falls back to the main thread where
 * workers are unavailable or have failed. Rejects with PendulumAnalysisError naming file, row, reason.
 */
export function analysePendulumFile(csvText: string, fileName: string): Promise<PendulumResult> {
  const target = pendulumWorker();
  if (!target) {
    return new Promise((resolve, reject) => {
      try {
        resolve(parseAndAnalysePendulumCsv(csvText, fileName));
      } catch (error) {
        const message = error instanceof Error ? error.message : String(error);
        reject(new PendulumAnalysisError(message, error instanceof PendulumInputError));
      }
    });
  }
  const id = nextId++;
  return new Promise((resolve, reject) => {
    pending.set(id, { resolve, reject });
    const request: PendulumRequest = { id, csvText, fileName };
    target.postMessage(request);
  });
}
