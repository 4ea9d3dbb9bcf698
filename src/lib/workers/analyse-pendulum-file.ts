import { analysePendulumText } from './analyse-pendulum-text';
import type { PendulumReply, PendulumRequest, PendulumResult } from './pendulum-protocol';

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

let worker: Worker | null = null;
let nextId = 1;
const pending = new Map<number, { resolve: (a: PendulumResult) => void; reject: (e: Error) => void }>();

function startWorker(): Worker | null {
  if (worker) return worker;
  if (typeof Worker === 'undefined') return null;
  try {
    worker = new Worker(new URL('./pendulum.worker.ts', import.meta.url), { type: 'module' });
  } catch {
    return null;
  }
  worker.onmessage = (event: MessageEvent<PendulumReply>) => {
    const reply = event.data;
    const waiter = pending.get(reply.id);
    if (!waiter) return;
    pending.delete(reply.id);
    if (reply.ok) waiter.resolve({ analysis: reply.analysis, raw: reply.raw });
    else waiter.reject(new PendulumAnalysisError(reply.message, reply.refused));
  };
  worker.onerror = (event) => {
    // A broken worker fails its pending jobs; the next call falls back to the main thread.
    for (const [, waiter] of pending) waiter.reject(new PendulumAnalysisError(event.message || 'the analysis worker failed', false));
    pending.clear();
    worker?.terminate();
    worker = null;
    workerBroken = true;
  };
  return worker;
}

let workerBroken = false;

/**
 * Analyses a pendulum recording (CSV text) in a Web Worker; falls back to the main thread where
 * workers are unavailable or have failed. Rejects with PendulumAnalysisError naming file, row, reason.
 */
export function analysePendulumFile(csvText: string, fileName: string): Promise<PendulumResult> {
  const target = workerBroken ? null : startWorker();
  if (!target) {
    return new Promise((resolve, reject) => {
      try {
        resolve(analysePendulumText(csvText, fileName));
      } catch (error) {
        const message = error instanceof Error ? error.message : String(error);
        reject(new PendulumAnalysisError(message, (error as Error)?.name === 'PendulumInputError'));
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
