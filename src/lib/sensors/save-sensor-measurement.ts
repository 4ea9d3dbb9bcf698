// Turns a sensor measurement into record inputs (observations, a trace) and saves them through an
// atomic save function (the store's saveAssessment). Kept structural (no import of the store) so that the
// sensors folder depends on the domain only, and so it can be tested against the real store in Node.
import { type Assessment, type Observation, type RecordInput, type Side, type Trace } from '../domain';
import type { MotionRecording } from './signal';

type ObservationInput = RecordInput<Observation>;
type AssessmentInput = RecordInput<Assessment>;
type TraceInput = RecordInput<Trace>;

/** An observation as the atomic save takes it: ids filled in by the store, the trace by index. */
export type AtomicObservationInput = Omit<ObservationInput, 'assessmentId' | 'traceId'> & { readonly traceIndex: number | null };

/**
 * What saving needs: who is writing, and a function that saves an assessment, its traces and
 * observations in one transaction (the store's saveAssessment, bound to a store, fits).
 */
export interface SensorSaveStore {
  readonly actor: { readonly clinicianId: string } | null;
  readonly saveAll: (
    assessment: AssessmentInput,
    observations: readonly AtomicObservationInput[],
    traces: ReadonlyArray<Omit<TraceInput, 'assessmentId'>>,
  ) => Promise<{ assessment: { id: string }; traces: ReadonlyArray<{ id: string }>; observations: ReadonlyArray<{ id: string }> }>;
}

export interface SensorSaveInput {
  readonly patientId: string;
  /** ISO instant of the measurement (also the assessment's time). */
  readonly performedAt: string;
  readonly setting: Assessment['setting'];
  readonly position: Assessment['conditions']['position'];
  readonly trace: Omit<TraceInput, 'patientId' | 'assessmentId'>;
  /** Builds the observations; the ids passed are placeholders that the store replaces. */
  readonly observations: (ids: { assessmentId: string; traceId: string }) => ObservationInput[];
}

const PENDING_ASSESSMENT = 'pending-assessment';
const PENDING_TRACE = 'pending-trace';

/**
 * Saves one sensor measurement as an assessment, its raw trace and its observations in a single
 * transaction: either all of it lands, or nothing does. Throws whatever the store throws
 * (StoreError), or Error when the device is not set up.
 */
export async function saveSensorMeasurement(store: SensorSaveStore, input: SensorSaveInput): Promise<{ assessmentId: string; traceId: string; observationIds: string[] }> {
  const actor = store.actor;
  if (!actor) throw new Error('This device is not set up yet: choose the clinician in Settings first.');
  const observations = input.observations({ assessmentId: PENDING_ASSESSMENT, traceId: PENDING_TRACE }).map(({ assessmentId: _a, traceId, ...rest }) => ({
    ...rest,
    traceIndex: traceId === PENDING_TRACE ? 0 : null,
  }));
  const saved = await store.saveAll(
    {
      patientId: input.patientId,
      assessorId: actor.clinicianId,
      performedAt: input.performedAt,
      setting: input.setting,
      conditions: { position: input.position, minutesSinceMedication: null, painNrs: null },
      notes: null,
    },
    observations,
    [{ ...input.trace, patientId: input.patientId }],
  );
  return { assessmentId: saved.assessment.id, traceId: saved.traces[0]?.id ?? '', observationIds: saved.observations.map((o) => o.id) };
}

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
