/// <reference lib="webworker" />
// Runs the pendulum engine off the main thread. Signals and raw columns travel back as transferred
// buffers, so a long 1 kHz trace is not copied.
import { parseAndAnalysePendulumCsv, PendulumInputError } from '$lib/pendulum';
import type { PendulumReply, PendulumRequest } from './pendulum-protocol';
import { transferablesOf } from './pendulum-transfer';

declare const self: DedicatedWorkerGlobalScope;

self.onmessage = (event: MessageEvent<PendulumRequest>) => {
  const { id, csvText, fileName } = event.data;
  try {
    const result = parseAndAnalysePendulumCsv(csvText, fileName);
    const reply: PendulumReply = { id, ok: true, ...result };
    self.postMessage(reply, transferablesOf(result));
  } catch (error) {
    const reply: PendulumReply = {
      id,
      ok: false,
      message: error instanceof Error ? error.message : String(error),
      refused: error instanceof PendulumInputError,
    };
    self.postMessage(reply);
  }
};
