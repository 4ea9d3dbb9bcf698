// Re-analysis of a phone pendulum recording already saved on a device (issue 13): the raw samples are
// kept in the trace's channels, so the corrected reconstruction (browsers' axis order, hand-held start)
// can be run again and compared with the saved observations. Pure: no storage; the schema-3 migration
// that writes the changes and their audit entries is still to be built on top of it.
import { type Observation, type ObservationValue, type Trace } from '../domain';
import { pendulumObservations } from '../pendulum';
import { analyseMotionRecording, MotionInputError, type MotionRecording } from './signal';

/** One saved observation whose value the re-analysis changes. */
export interface ReanalysedValue {
  readonly observationId: string;
  readonly measureCode: string;
  readonly before: ObservationValue;
  /** The new value, or null when the re-analysis no longer yields one (refused or out of range). */
  readonly after: ObservationValue | null;
}

export type ReanalysisOutcome =
  | { readonly kind: 'not-a-phone-recording' }
  | { readonly kind: 'refused'; readonly reason: string }
  | { readonly kind: 'analysed'; readonly changes: ReanalysedValue[] };

const CHANNELS = ['time_ms', 'rate_alpha_dps', 'rate_beta_dps', 'rate_gamma_dps', 'acc_x_ms2', 'acc_y_ms2', 'acc_z_ms2'] as const;

/**
 * Re-analyses one saved trace and lists the observations (linked to it) whose value changes.
 * A trace without the seven device-motion channels is not a phone recording. Values compare as
 * equal when they agree to 1e-9 (a store round trip keeps doubles exactly). Never throws for a
 * recording the analysis refuses: that is an outcome, with the reason.
 */
export function reanalyseSavedRecording(trace: Pick<Trace, 'channels'>, observations: readonly Pick<Observation, 'id' | 'measureCode' | 'value' | 'side'>[]): ReanalysisOutcome {
  const columns = CHANNELS.map((name) => trace.channels.find((c) => c.name === name)?.samples);
  if (columns.some((c) => c === undefined)) return { kind: 'not-a-phone-recording' };
  const [timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2] = columns as Float64Array[];
  const recording: MotionRecording = { timeMs, rateAlphaDps, rateBetaDps, rateGammaDps, accXMs2, accYMs2, accZMs2 };
  let indices;
  try {
    indices = analyseMotionRecording(recording, { fileName: 'saved recording' }).analysis.indices;
  } catch (error) {
    if (error instanceof MotionInputError) return { kind: 'refused', reason: error.reason };
    throw error;
  }
  const side = observations[0]?.side ?? 'left';
  const rebuilt = pendulumObservations(indices, { side }).observations;
  const changes: ReanalysedValue[] = [];
  for (const o of observations) {
    const fresh = rebuilt.find((r) => r.measureCode === o.measureCode);
    const after = fresh ? fresh.value : null;
    if (!after || !sameValue(o.value, after)) changes.push({ observationId: o.id, measureCode: o.measureCode, before: o.value, after });
  }
  return { kind: 'analysed', changes };
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
