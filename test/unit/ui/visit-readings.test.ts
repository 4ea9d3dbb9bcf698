// Readings taken inside a visit (issue 14): kept in the visit's draft as plain JSON, saved with the
// visit in one transaction through the real store (Dexie on fake-indexeddb). The phone recording comes
// from the independent simulator (test/reference/sensors), not from the code under test.
import { describe, expect, it } from 'vitest';
import type { Observation } from '../../../src/lib/domain';
import { analyseMotionRecording, type SteadyReading } from '../../../src/lib/sensors';
import { saveAssessment } from '../../../src/lib/store';
import { inclinometerReading, pendulumPhoneReading } from '../../../src/lib/ui/instruments/instrument-readings';
import { visitContents } from '../../../src/lib/ui/visit-contents';
import { plainChannels, readingSaveInputs, readingsFromDraft, repeatedReadings, type VisitReading } from '../../../src/lib/ui/visit-readings';
import { phonePendulumCases, simulatePhonePendulum } from '../../reference/sensors/phone-pendulum-simulator';
import { freshStore } from '../store/store-helpers';

const steady = (x: number, y: number, z: number): SteadyReading => ({ steady: true, reason: '', meanX: x, meanY: y, meanZ: z, spreadDeg: 0.2, maxRateDps: 0.5, samples: 60 });
/** A draft goes to IndexedDB as JSON-safe content: the same trip as writeDraft's check and a reload. */
const throughDraft = <T>(value: T): T => JSON.parse(JSON.stringify(value)) as T;

function phoneReading(key: string, side: 'left' | 'right' = 'right'): { reading: VisitReading; recording: ReturnType<typeof simulatePhonePendulum>['recording'] } {
  const stream = simulatePhonePendulum({ ...phonePendulumCases(1, 11)[0], rateHz: 60 });
  const { analysis, reconstruction } = analyseMotionRecording(stream.recording);
  return { reading: pendulumPhoneReading(analysis.indices, stream.recording, reconstruction, side, key, '2026-11-20T10:05:00.000Z'), recording: stream.recording };
}
// A joint moved 72° between the two gravity readings (phone on the shin, long edge y): g along y, then turned about x.
const rad = (72 * Math.PI) / 180;
const incline = (key: string, angleOverride?: number) =>
  inclinometerReading(steady(0, 9.81, 0), steady(0, 9.81 * Math.cos(rad), 9.81 * Math.sin(rad)), angleOverride ?? 72, { siteCode: 'knee-flexion', siteLabel: 'Knee flexion', side: 'right', mode: 'passive' }, key, '2026-11-20T10:10:00.000Z');

describe('plainChannels', () => {
  it('keeps every sample exactly through the draft (JSON) and back', () => {
    const samples = Float64Array.of(0.1 + 0.2, 1e-300, 5e-324, Math.PI, -123456.789012345, 2 ** 53 + 2, 1 / 3);
    const back = Float64Array.from(throughDraft(plainChannels([{ name: 'angle', unit: 'deg', samples }]))[0]!.samples);
    expect(Array.from(back)).toEqual(Array.from(samples));
  });
  it('refuses a sample that is not finite, naming the channel and the sample', () => {
    expect(() => plainChannels([{ name: 'knee angle', unit: 'deg', samples: Float64Array.of(1, 2, Number.NaN) }])).toThrow('channel "knee angle", sample 3: not a finite number');
    expect(() => plainChannels([{ name: 'g', unit: 'm/s2', samples: Float64Array.of(Infinity) }])).toThrow('sample 1');
  });
});

describe('a visit with a form grade, a phone pendulum test and an inclinometer reading', () => {
  it('saves as one assessment: each reading linked to its own trace, the raw samples unchanged, every record audited', async () => {
    const store = await freshStore({ passphrase: null });
    const patient = await store.patients.create({ code: 'K7QM-3XHD', birthYear: 1970, condition: 'stroke', affectedSides: ['right'], status: 'active' });
    const { reading: pendulum, recording } = phoneReading('r1');
    const readings = throughDraft([pendulum, incline('r2')]);
    const performedAt = '2026-11-20T10:00:00.000Z';
    const fromReadings = readingSaveInputs(readingsFromDraft(readings).readings, patient.id, performedAt);
    const mas = { measureCode: 'mas', siteCode: 'knee-extensors', side: 'right' as const, mode: null, instrument: null, value: { kind: 'ordinal' as const, grade: '1+', rank: 2 } };
    const saved = await saveAssessment(
      store,
      { patientId: patient.id, assessorId: store.actor!.clinicianId, performedAt, setting: 'home', conditions: { position: 'sitting', minutesSinceMedication: null, painNrs: null }, notes: null },
      [{ ...mas, patientId: patient.id, takenAt: performedAt, traceIndex: null }, ...fromReadings.observations],
      fromReadings.traces,
    );
    expect((await store.assessments.byPatient(patient.id)).length).toBe(1);
    const observations = await store.observations.byPatient(patient.id);
    const traces = await store.traces.byPatient(patient.id);
    expect(traces.map((t) => t.kind).sort()).toEqual(['inclinometer-angle', 'pendulum-knee-angle']);
    const pendulumTrace = traces.find((t) => t.kind === 'pendulum-knee-angle')!;
    const inclinometerTrace = traces.find((t) => t.kind === 'inclinometer-angle')!;
    const byCode = (code: string) => observations.filter((o) => o.measureCode === code);
    expect(observations.filter((o) => o.measureCode.startsWith('pendulum-')).every((o) => o.traceId === pendulumTrace.id)).toBe(true);
    expect(byCode('rom').map((o) => [o.traceId, o.instrument, (o.value as { angleDeg: number }).angleDeg])).toEqual([[inclinometerTrace.id, 'phone-sensor', 72]]);
    expect(byCode('mas')[0]!.traceId).toBeNull();
    for (const o of observations) expect(o.assessmentId).toBe(saved.assessment.id);
    // The raw rotation rates as the phone gave them, bit for bit, after the trip through the draft.
    const alpha = pendulumTrace.channels.find((c) => c.name === 'rate_alpha_dps')!.samples;
    expect(Array.from(alpha)).toEqual(Array.from(recording.rateAlphaDps));
    const audited = new Set((await store.db.table('audit').toArray()).map((e: { recordId: string | null }) => e.recordId));
    for (const id of [saved.assessment.id, ...observations.map((o) => o.id), ...traces.map((t) => t.id)]) expect(audited.has(id)).toBe(true);
  });

  it('writes nothing when one reading is refused by the record (all or nothing)', async () => {
    const store = await freshStore({ passphrase: null });
    const patient = await store.patients.create({ code: 'K7QM-3XHE', birthYear: 1970, condition: 'stroke', affectedSides: ['right'], status: 'active' });
    const performedAt = '2026-11-20T10:00:00.000Z';
    // 400° is outside every range-of-motion limit of the catalogue.
    const fromReadings = readingSaveInputs([phoneReading('r1').reading, incline('r2', 400)], patient.id, performedAt);
    await expect(
      saveAssessment(store, { patientId: patient.id, assessorId: store.actor!.clinicianId, performedAt, setting: 'home', conditions: { position: null, minutesSinceMedication: null, painNrs: null }, notes: null }, fromReadings.observations, fromReadings.traces),
    ).rejects.toThrow();
    expect(await store.assessments.byPatient(patient.id)).toEqual([]);
    expect(await store.observations.byPatient(patient.id)).toEqual([]);
    expect(await store.traces.byPatient(patient.id)).toEqual([]);
  });
});

describe('repeatedReadings', () => {
  it('names a reading that repeats a test already in the visit, and only that one', () => {
    const romRow = { measureCode: 'rom', siteCode: 'knee-flexion', side: 'right' as const, mode: 'passive' as const };
    expect(repeatedReadings([incline('a')], [romRow]).map((r) => r.key)).toEqual(['a']);
    expect(repeatedReadings([incline('a')], [{ ...romRow, mode: 'active' }])).toEqual([]);
    // Two pendulum tests of the same knee in one visit: the second is named.
    expect(repeatedReadings([phoneReading('p1').reading, phoneReading('p2').reading, phoneReading('p3', 'left').reading], []).map((r) => r.key)).toEqual(['p2']);
  });
});

describe('readingsFromDraft', () => {
  it('keeps well-formed readings and names every other one with what is wrong, never dropping it silently', () => {
    const good = throughDraft(incline('ok'));
    const badSamples = { ...good, title: 'Inclinometer, bent', trace: { ...good.trace, channels: [{ name: 'a', unit: 'deg', samples: 'no' }] } };
    const stored = [good, null, { key: 'x' }, { ...good, title: 'A stopwatch reading', instrument: 'stopwatch' }, badSamples];
    const { readings, unreadable } = readingsFromDraft(stored);
    expect(readings.map((r) => r.key)).toEqual(['ok']);
    // Names and problems written by hand: the title when there is one, else the reading's place.
    expect(unreadable.map((u) => [u.name, u.problem])).toEqual([
      ['reading 2', 'not a reading'],
      ['reading 3', 'no title'],
      ['A stopwatch reading', 'unknown instrument "stopwatch"'],
      ['Inclinometer, bent', 'channel 1 has no sample list'],
    ]);
    // Kept exactly as stored, so that writing the draft again loses nothing.
    expect(unreadable.map((u) => u.stored)).toEqual(stored.slice(1));
    expect(readingsFromDraft(undefined)).toEqual({ readings: [], unreadable: [] });
    expect(readingsFromDraft({ not: 'a list' }).unreadable.map((u) => u.problem)).toEqual(['not a list']);
  });
});

describe('visitContents', () => {
  it('names every test of a visit once, with the instruments of range of motion, skipping deleted records', () => {
    const o = (measureCode: string, instrument: Observation['instrument'] = null, deleted = false) => ({ measureCode, instrument, deleted });
    // Expected line written by hand from the catalogue's labels.
    expect(
      visitContents([o('mas'), o('mas'), o('rom', 'universal-goniometer'), o('pendulum-ri'), o('pendulum-swing-count'), o('rom', 'phone-sensor'), o('tardieu', null, true)]),
    ).toBe('Modified Ashworth Scale · Range of motion (goniometer, phone) · Pendulum test');
  });
});
