// Re-analysis of a phone pendulum recording already saved on a device (issue 13): the raw samples are
// kept in the trace's channels, so the corrected reconstruction (browsers' axis order, hand-held start)
// can be run again and compared with the saved observations. Pure: no storage. The schema-7 step that
// writes the changes and their audit entries is the store's `runPendingPhoneReanalysis`.
import { type Observation, type ObservationValue, type Trace } from '../domain';
import { pendulumObservations } from '../pendulum';
import { DERIVED_ANGLE_CHANNEL, PHONE_MOTION_CHANNELS } from './sensor-records';
import { analyseMotionRecording, MotionInputError, type MotionRecording } from './signal';

/** One saved observation whose value the re-analysis changes. */
export interface ReanalysedValue {
  readonly observationId: string;
  readonly measureCode: string;
  readonly before: ObservationValue;
  /** The new value, or null when the re-analysis no longer yields one (out of the record's range, not measurable). */
  readonly after: ObservationValue | null;
}

/** A measure the corrected analysis yields that the older one left out (e.g. an R2 it found out of range). */
export interface AddedValue {
  readonly measureCode: string;
  readonly value: ObservationValue;
}

export type ReanalysisOutcome =
  | { readonly kind: 'not-a-phone-recording' }
  | { readonly kind: 'refused'; readonly reason: string }
  | {
      readonly kind: 'analysed';
      readonly changes: ReanalysedValue[];
      readonly added: AddedValue[];
      /** The corrected knee angle, one value per saved sample (replaces the trace's derived `knee_flexion_deg`). */
      readonly angleDeg: Float64Array;
      /** The trace channel that holds the derived angle. */
      readonly angleChannel: typeof DERIVED_ANGLE_CHANNEL;
    };

/**
 * Re-analyses one saved trace and lists the observations (linked to it) whose value changes, and the
 * measures the older analysis left out. A trace without the seven device-motion channels is not a
 * phone recording. Values compare as equal when they agree to 1e-9 (a store round trip keeps doubles
 * exactly). Never throws for a recording the analysis refuses: that is an outcome, with the reason.
 */
export function reanalyseSavedRecording(trace: Pick<Trace, 'channels'>, observations: readonly Pick<Observation, 'id' | 'measureCode' | 'value' | 'side'>[]): ReanalysisOutcome {
  const columns = PHONE_MOTION_CHANNELS.map((name) => trace.channels.find((c) => c.name === name)?.samples);
  if (columns.some((c) => c === undefined)) return { kind: 'not-a-phone-recording' };
  const [timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2] = columns as Float64Array[];
  const recording: MotionRecording = { timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2 };
  let result;
  try {
    result = analyseMotionRecording(recording, { fileName: 'saved recording' });
  } catch (error) {
    if (error instanceof MotionInputError) return { kind: 'refused', reason: error.reason };
    throw error;
  }
  const side = observations[0]?.side ?? 'left';
  const rebuilt = pendulumObservations(result.analysis.indices, { side }).observations;
  const changes: ReanalysedValue[] = [];
  for (const o of observations) {
    const fresh = rebuilt.find((r) => r.measureCode === o.measureCode);
    const after = fresh ? fresh.value : null;
    if (!after || !sameValue(o.value, after)) changes.push({ observationId: o.id, measureCode: o.measureCode, before: o.value, after });
  }
  const added = rebuilt.filter((r) => !observations.some((o) => o.measureCode === r.measureCode)).map((r) => ({ measureCode: r.measureCode, value: r.value }));
  return { kind: 'analysed', changes, added, angleDeg: result.reconstruction.angleDeg, angleChannel: DERIVED_ANGLE_CHANNEL };
}

function sameValue(a: ObservationValue, b: ObservationValue): boolean {
  const x = a as unknown as Record<string, unknown>;
  const y = b as unknown as Record<string, unknown>;
  const keys = new Set([...Object.keys(x), ...Object.keys(y)]);
  for (const key of keys) {
    const p = x[key];
    const q = y[key];
    if (typeof p === 'number' && typeof q === 'number') {
      if (!(Math.abs(p - q) <= 1e-9 * Math.max(1, Math.abs(p)))) return false;
    } else if (p !== q) return false;
  }
  return true;
}
