/** What a client does with its worker's replies, and when the worker breaks (its pending work fails). */
export interface WorkerHandlers<Reply> {
  readonly reply: (reply: Reply) => void;
  readonly broken: (message: string) => void;
}

/**
 * One lazily started Web Worker with a main-thread fallback: the returned function gives the running
 * worker (started on first use), or null where workers are unavailable, the worker could not start,
 * or it has failed once (`onerror`: `broken` is called so the client can fail its pending work, the
 * worker is terminated, and every later call returns null, so the client runs the same code on the
 * main thread). `create` must hold the literal `new Worker(new URL('./x.worker.ts', import.meta.url),
 * { type: 'module' })` so that Vite bundles the worker.
 */
export function workerWithFallback<Reply>(create: () => Worker, handlers: WorkerHandlers<Reply>): () => Worker | null {
  let worker: Worker | null = null;
  let broken = false;
  return () => {
    if (worker) return worker;
    if (broken || typeof Worker === 'undefined') return null;
    try {
      worker = create();
    } catch {
      broken = true;
      return null;
    }
    worker.onmessage = (event: MessageEvent<Reply>) => handlers.reply(event.data);
    worker.onerror = (event) => {
      handlers.broken(event.message || '');
      worker?.terminate();
      worker = null;
      broken = true;
    };
    return worker;
  };
}
