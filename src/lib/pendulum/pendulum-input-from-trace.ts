import type { PendulumTraceInput } from './analyse-pendulum-trace';
import { PendulumInputError } from './pendulum-input-error';

/** A stored trace as far as the pendulum engine needs it (the store's Trace record fits). */
export interface StoredTraceColumns {
  readonly sampleRateHz: number;
  readonly channels: ReadonlyArray<{ readonly name: string; readonly unit: string; readonly samples: Float64Array }>;
}

/**
 * The channel names a pendulum test from a file is saved under (stored data, not words of the page):
 * the knee's angular velocity must say "knee" for pendulumInputFromTrace to read it back.
 */
export const PENDULUM_FILE_CHANNEL_NAMES = { angleDeg: 'knee flexion angle', gyroDps: 'knee angular velocity', emgUv: 'EMG' } as const;

/**
 * Reads a saved pendulum trace back into the engine's input, by the channels' units (names differ between
 * a file import, the phone recorder and the demo): time from a channel in "s" or "ms" (else sample i at
 * i / sampleRateHz); knee angle from the channel in "deg"; knee angular velocity from a "deg/s" channel
 * whose name says knee (the phone's own rotation rates are not the knee's); EMG from "uV". The samples
 * are passed on, not copied. Throws PendulumInputError (with `label` as the file name) when no knee angle
 * or knee velocity is there.
 */
export function pendulumInputFromTrace(trace: StoredTraceColumns, label: string): PendulumTraceInput {
  const byUnit = (unit: string, test: (name: string) => boolean = () => true) =>
    trace.channels.find((c) => c.unit === unit && test(c.name.toLowerCase()))?.samples ?? null;
  const angleDeg = byUnit('deg');
  const gyroDps = byUnit('deg/s', (name) => name.includes('knee'));
  if (!angleDeg && !gyroDps) throw new PendulumInputError(label, null, 'this trace holds no knee angle or knee angular velocity');
  const n = (angleDeg ?? gyroDps)!.length;
  const seconds = byUnit('s');
  const millis = seconds ? null : byUnit('ms');
  let timeS: Float64Array;
  if (seconds) timeS = seconds;
  else if (millis) timeS = Float64Array.from(millis, (t) => t / 1000);
  else timeS = Float64Array.from({ length: n }, (_, i) => i / trace.sampleRateHz);
  return { timeS, angleDeg, gyroDps, emgUv: byUnit('uV') };
}
