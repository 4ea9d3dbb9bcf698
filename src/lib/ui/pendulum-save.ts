import type { PendulumIndices } from '$lib/pendulum';
import type { PendulumResult } from '$lib/workers';

/** The pendulum indices as observations of the catalogue's pendulum measures (knee, one side). */
export function pendulumObservations(i: PendulumIndices, patientId: string, side: 'left' | 'right', takenAt: string, traceIndex: number | null = 0) {
  const base = { patientId, takenAt, siteCode: 'knee', side, mode: null, instrument: null, traceIndex } as const;
  const round = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;
  return [
    { ...base, measureCode: 'pendulum-ri', value: { kind: 'index' as const, value: round(i.relaxationIndex, 4) } },
    { ...base, measureCode: 'pendulum-ri-normalised', value: { kind: 'index' as const, value: round(i.normalizedRelaxationIndex, 4) } },
    { ...base, measureCode: 'pendulum-first-swing', value: { kind: 'angle' as const, angleDeg: round(i.a1Deg, 2) } },
    { ...base, measureCode: 'pendulum-resting-angle', value: { kind: 'angle' as const, angleDeg: round(i.restAngleDeg, 2) } },
    { ...base, measureCode: 'pendulum-swing-count', value: { kind: 'count' as const, value: i.peakCount } },
  ];
}

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
