import type { Assessment, Observation, Trace } from '$lib/domain';
import { saveAssessment, type AssessmentObservationInput, type AssessmentTraceInput, type KinnoteStore } from '$lib/store';

/**
 * A reading taken with an instrument (a pendulum test from a file or the phone, a phone inclinometer
 * reading): its observations and the raw trace behind them, not yet saved. Inside a visit the reading
 * waits in the visit's draft and is saved with the visit, in the visit's one transaction (all or
 * nothing, each record audited); outside a visit it is saved at once as a visit of its own.
 *
 * Why the draft and not "attach to the open visit": a visit is written once, when the therapist
 * presses Save, so a visit left half done never shows on the patient's page and nothing saved has to
 * be changed afterwards (which would need an amendment with a reason). The price is the size of the
 * draft (a 60 s phone recording is about 25,000 numbers as JSON), written at most every 250 ms while
 * typing; the channels are kept as plain number lists so that a draft is written without converting them.
 */
export interface VisitReading {
  /** Unique within the visit form. */
  readonly key: string;
  readonly instrument: 'pendulum-file' | 'pendulum-phone' | 'inclinometer';
  /** One line for the visit form, e.g. "Pendulum (phone), right knee: R2 1.21". */
  readonly title: string;
  /** Values left out because the record does not accept them (named, never clamped). */
  readonly skipped: readonly string[];
  readonly observations: readonly ReadingObservation[];
  readonly trace: PlainTrace;
}

export type ReadingObservation = Pick<Observation, 'measureCode' | 'siteCode' | 'side' | 'mode' | 'instrument' | 'value'>;

/** A trace as plain JSON (what a draft may hold): channels as number lists. */
export interface PlainTrace {
  readonly kind: Trace['kind'];
  readonly startedAt: string;
  readonly sampleRateHz: number;
  readonly channels: ReadonlyArray<{ readonly name: string; readonly unit: string; readonly samples: readonly number[] }>;
}

export const INSTRUMENT_LABELS: Record<VisitReading['instrument'], string> = {
  'pendulum-file': 'Pendulum (file)',
  'pendulum-phone': 'Pendulum (phone)',
  inclinometer: 'Inclinometer (phone)',
};

/**
 * Channels as plain number lists for a draft. Throws when a sample is not finite (JSON cannot hold it,
 * and the store would refuse it anyway), naming the channel and the sample.
 */
export function plainChannels(channels: ReadonlyArray<{ name: string; unit: string; samples: Float64Array }>): PlainTrace['channels'] {
  return channels.map((c) => {
    const bad = c.samples.findIndex((x) => !Number.isFinite(x));
    if (bad >= 0) throw new Error(`channel "${c.name}", sample ${bad + 1}: not a finite number`);
    return { name: c.name, unit: c.unit, samples: Array.from(c.samples) };
  });
}

/** The readings' observations and traces as the store's atomic save takes them (traces after `firstTraceIndex`). */
export function readingSaveInputs(
  readings: readonly VisitReading[],
  patientId: string,
  takenAt: string,
  firstTraceIndex = 0,
): { observations: AssessmentObservationInput[]; traces: AssessmentTraceInput[] } {
  const observations: AssessmentObservationInput[] = [];
  const traces: AssessmentTraceInput[] = [];
  readings.forEach((reading, n) => {
    const t = reading.trace;
    traces.push({
      patientId,
      kind: t.kind,
      startedAt: t.startedAt,
      sampleRateHz: t.sampleRateHz,
      channels: t.channels.map((c) => ({ name: c.name, unit: c.unit, samples: Float64Array.from(c.samples) })),
    });
    for (const o of reading.observations) observations.push({ ...o, patientId, takenAt, traceIndex: firstTraceIndex + n });
  });
  return { observations, traces };
}

/** Where two entries of one visit measure the same thing (measure, site, side, movement): "Range of motion …". */
export function sameSeriesKey(o: Pick<Observation, 'measureCode' | 'siteCode' | 'side' | 'mode'>): string {
  return `${o.measureCode}|${o.siteCode}|${o.side}|${o.mode ?? ''}`;
}

/**
 * Readings that repeat a test already in the visit (a form row, or an earlier reading): one visit holds
 * one value per measure, site, side and movement, so each repeat is named for the person to remove.
 */
export function repeatedReadings(readings: readonly VisitReading[], formObservations: ReadonlyArray<Pick<Observation, 'measureCode' | 'siteCode' | 'side' | 'mode'>>): Array<{ key: string; message: string }> {
  const seen = new Set(formObservations.map(sameSeriesKey));
  const repeats: Array<{ key: string; message: string }> = [];
  for (const reading of readings) {
    const keys = reading.observations.map(sameSeriesKey);
    if (keys.some((k) => seen.has(k))) repeats.push({ key: reading.key, message: `${reading.title}: this test is already in the visit; remove one of the two` });
    for (const k of keys) seen.add(k);
  }
  return repeats;
}

/** A reading in a stored draft that cannot be read back: named for the person, kept as it was in the draft. */
export interface UnreadableReading {
  /** The reading's own title when it has one, else its place ("reading 2"). */
  readonly name: string;
  /** What is wrong with it, e.g. "channel 1 has no sample list". */
  readonly problem: string;
  /** The stored value, unchanged (written back to the draft so that nothing is lost by reading it). */
  readonly stored: unknown;
}

/** Why a stored reading cannot be used, or null when it can. */
function readingProblem(x: Partial<VisitReading> | null): string | null {
  if (typeof x !== 'object' || x === null) return 'not a reading';
  if (typeof x.key !== 'string') return 'no key';
  if (typeof x.title !== 'string') return 'no title';
  if (typeof x.instrument !== 'string' || !Object.hasOwn(INSTRUMENT_LABELS, x.instrument)) return `unknown instrument ${JSON.stringify(x.instrument)}`;
  if (!Array.isArray(x.observations)) return 'no observation list';
  if (!Array.isArray(x.skipped)) return 'no list of values left out';
  if (typeof x.trace?.startedAt !== 'string') return 'the trace has no start time';
  if (!Array.isArray(x.trace.channels)) return 'the trace has no channel list';
  const bad = x.trace.channels.findIndex((c) => !Array.isArray(c?.samples));
  return bad >= 0 ? `channel ${bad + 1} has no sample list` : null;
}

/**
 * Reads readings back from a stored draft. A reading that cannot be read is never dropped silently:
 * it comes back in `unreadable`, named (its title, else its place) with what is wrong, for the form
 * to tell the person, and kept as stored.
 */
export function readingsFromDraft(content: unknown): { readings: VisitReading[]; unreadable: UnreadableReading[] } {
  const readings: VisitReading[] = [];
  const unreadable: UnreadableReading[] = [];
  if (content === undefined || content === null) return { readings, unreadable };
  if (!Array.isArray(content)) return { readings, unreadable: [{ name: 'the readings', problem: 'not a list', stored: content }] };
  content.forEach((stored: unknown, n) => {
    const x = stored as Partial<VisitReading> | null;
    const problem = readingProblem(x);
    if (problem === null) readings.push(x as VisitReading);
    else unreadable.push({ name: typeof x?.title === 'string' && x.title !== '' ? x.title : `reading ${n + 1}`, problem, stored });
  });
  return { readings, unreadable };
}

/**
 * A reading taken outside a visit (the instrument's own page): saved at once as a visit of its own,
 * the assessment, its trace and observations in one transaction. Throws the store's errors, or Error
 * when the device is not set up.
 */
export async function saveReadingAlone(
  store: KinnoteStore,
  patientId: string,
  reading: VisitReading,
  context: { setting: Assessment['setting']; position: Assessment['conditions']['position'] },
): Promise<void> {
  const actor = store.actor;
  if (!actor) throw new Error('This device is not set up yet: choose the clinician in Settings first.');
  const performedAt = reading.trace.startedAt;
  const { observations, traces } = readingSaveInputs([reading], patientId, performedAt);
  await saveAssessment(
    store,
    { patientId, assessorId: actor.clinicianId, performedAt, setting: context.setting, conditions: { position: context.position, minutesSinceMedication: null, painNrs: null }, notes: null },
    observations,
    traces,
  );
}
