// Record pieces built from phone sensor readings: the trace channels of a motion recording and a
// range-of-motion observation. Saving is the visit's one path (ui/visit-readings.ts: readingSaveInputs
// and the store's saveAssessment, in one transaction), whether the reading is taken inside a visit
// or on its own. Pure: depends on the domain only.
import { type Observation, type RecordInput, type Side, type Trace } from '../domain';
import type { MotionRecording } from './signal';

type ObservationInput = RecordInput<Observation>;
type TraceInput = RecordInput<Trace>;

/** The raw device-motion channels of a saved phone recording, in the browser's names (rate_alpha_dps: about device x). */
export const PHONE_MOTION_CHANNELS = ['time_ms', 'rate_alpha_dps', 'rate_beta_dps', 'rate_gamma_dps', 'acc_x_ms2', 'acc_y_ms2', 'acc_z_ms2'] as const;
const PHONE_MOTION_UNITS = ['ms', 'deg/s', 'deg/s', 'deg/s', 'm/s2', 'm/s2', 'm/s2'] as const;
/** The derived channel: the knee angle reconstructed at save time (re-written by the schema-7 re-analysis). */
export const DERIVED_ANGLE_CHANNEL = 'knee_flexion_deg';

/** The raw motion samples (and optionally the reconstructed angle) as trace channels (copies), units in UCUM. */
export function motionTraceChannels(recording: MotionRecording, angleDeg?: Float64Array): TraceInput['channels'] {
  const columns = [recording.timeMs, recording.rateAlphaDps, recording.rateBetaDps, recording.rateGammaDps, recording.accXMs2, recording.accYMs2, recording.accZMs2];
  const channels: TraceInput['channels'] = PHONE_MOTION_CHANNELS.map((name, i) => ({ name, unit: PHONE_MOTION_UNITS[i]!, samples: columns[i]!.slice() }));
  if (angleDeg) channels.push({ name: DERIVED_ANGLE_CHANNEL, unit: 'deg', samples: angleDeg.slice() });
  return channels;
}

interface ObservationContext {
  readonly patientId: string;
  readonly assessmentId: string;
  readonly takenAt: string;
  readonly side: Side;
  readonly traceId: string | null;
}

/** One range-of-motion observation measured with the phone (measure 'rom', instrument 'phone-sensor'). */
export function romObservation(ctx: ObservationContext & { siteCode: string; mode: 'active' | 'passive'; angleDeg: number }): ObservationInput {
  return {
    patientId: ctx.patientId,
    assessmentId: ctx.assessmentId,
    takenAt: ctx.takenAt,
    side: ctx.side,
    traceId: ctx.traceId,
    measureCode: 'rom',
    siteCode: ctx.siteCode,
    mode: ctx.mode,
    instrument: 'phone-sensor',
    value: { kind: 'angle', angleDeg: ctx.angleDeg },
  };
}
