import type { PendulumResult } from './pendulum-protocol';

/** Buffers a result can hand over to another thread without copying. */
export function transferablesOf(result: PendulumResult): Transferable[] {
  const s = result.analysis.signals;
  const r = result.raw;
  const columns = [s.angleDeg, s.velocityDps, s.emgEnvelopeUv, s.flexionPeakIndices, s.extensionPeakIndices, r.timeS, r.angleDeg, r.gyroDps, r.emgUv, r.lines];
  const buffers = new Set<ArrayBufferLike>();
  for (const c of columns) if (c) buffers.add(c.buffer);
  return [...buffers] as Transferable[];
}
