import type { PendulumResult } from '$lib/workers';

/** The raw recording as a trace: its own time column and every signal column it had. */
export function pendulumTraceInput(result: PendulumResult, patientId: string, startedAt: string) {
  const raw = result.raw;
  // Copies own plain ArrayBuffers (the worker's may be typed as shared), and keep the store's rows apart from the chart's.
  const column = (a: Float64Array) => new Float64Array(a);
  const channels = [{ name: 'time', unit: 's', samples: column(raw.timeS) }];
  if (raw.angleDeg) channels.push({ name: 'knee flexion angle', unit: 'deg', samples: column(raw.angleDeg) });
  if (raw.gyroDps) channels.push({ name: 'knee angular velocity', unit: 'deg/s', samples: column(raw.gyroDps) });
  if (raw.emgUv) channels.push({ name: 'EMG', unit: 'uV', samples: column(raw.emgUv) });
  return {
    patientId,
    kind: 'pendulum-knee-angle' as const,
    startedAt,
    sampleRateHz: result.analysis.indices.sampleRateHz,
    channels,
  };
}
