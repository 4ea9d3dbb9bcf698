/// <reference lib="webworker" />
// Runs the pendulum engine off the main thread. The processed signals travel back as transferred
// buffers, so a long 1 kHz trace is not copied.
import { analysePendulumCsv, PendulumInputError } from '$lib/pendulum';
import type { PendulumReply, PendulumRequest } from './pendulum-protocol';

declare const self: DedicatedWorkerGlobalScope;

self.onmessage = (event: MessageEvent<PendulumRequest>) => {
  const { id, csvText, fileName } = event.data;
  let reply: PendulumReply;
  const transfer: Transferable[] = [];
  try {
    const analysis = analysePendulumCsv(csvText, fileName);
    const s = analysis.signals;
    for (const column of [s.angleDeg, s.velocityDps, s.emgEnvelopeUv, s.flexionPeakIndices, s.extensionPeakIndices]) {
      if (column) transfer.push(column.buffer);
    }
    reply = { id, ok: true, analysis };
  } catch (error) {
    reply = {
      id,
      ok: false,
      message: error instanceof Error ? error.message : String(error),
      refused: error instanceof PendulumInputError,
    };
  }
  self.postMessage(reply, transfer);
};
