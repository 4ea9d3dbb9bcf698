import { describe, expect, it } from 'vitest';
import { ordinalValue } from '../../../src/lib/domain';
import { saveAssessment, StoreError } from '../../../src/lib/store';
import { dumpAll, freshStore, quotaFault } from './store-helpers';


async function withPatient(options: Parameters<typeof freshStore>[0] = {}) {
  const store = await freshStore(options);
  const patient = await store.patients.create({ code: 'K7QM-3XHD', birthYear: 1970, condition: 'stroke', affectedSides: ['left'], status: 'active' });
  const assessment = {
    patientId: patient.id,
    assessorId: store.actor!.clinicianId,
    performedAt: '2025-03-02T10:00:00.000Z',
    setting: 'home' as const,
    conditions: { position: 'sitting' as const, minutesSinceMedication: null, painNrs: null },
    notes: 'Invented note',
  };
  const observations = [
    { patientId: patient.id, takenAt: assessment.performedAt, measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left' as const, mode: null, instrument: null, value: ordinalValue('mas', '2') },
    { patientId: patient.id, takenAt: assessment.performedAt, measureCode: 'pendulum-ri', siteCode: 'knee', side: 'left' as const, mode: null, instrument: null, value: { kind: 'index' as const, value: 1.2 }, traceIndex: 0 },
  ];
  const traces = [{ patientId: patient.id, kind: 'pendulum-knee-angle' as const, startedAt: assessment.performedAt, sampleRateHz: 100, channels: [{ name: 'time', unit: 's', samples: new Float64Array([0, 0.01, 0.02]) }] }];
  return { store, patient, assessment, observations, traces };
}

describe('saveAssessment', () => {
  it('writes the assessment, its observations and trace, linked by id, with one audit entry each', async () => {
    const { store, patient, assessment, observations, traces } = await withPatient();
    const before = await store.audit.count();
    const saved = await saveAssessment(store, assessment, observations, traces);
    const rows = await store.observations.byPatient(patient.id);
    expect(rows).toHaveLength(2);
    for (const row of rows) expect(row.assessmentId).toBe(saved.assessment.id);
    expect(rows.find((r) => r.measureCode === 'pendulum-ri')?.traceId).toBe(saved.traces[0]!.id);
    expect(rows.find((r) => r.measureCode === 'mas')?.traceId).toBeNull();
    expect(await store.audit.count()).toBe(before + 4);
    const opened = await store.assessments.open((await store.assessments.get(saved.assessment.id))!);
    expect(opened.notes).toBe('Invented note');
  });

  it('an invalid observation refuses the whole assessment, naming the record and field, and writes nothing', async () => {
    const { store, assessment, observations } = await withPatient();
    const before = await dumpAll(store);
    const bad = [...observations, { ...observations[0]!, siteCode: 'elbow-flexors', side: 'none' as const }];
    const error = await saveAssessment(store, assessment, bad).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(StoreError);
    expect((error as StoreError).code).toBe('ValidationFailed');
    expect((error as StoreError).issues[0]).toMatchObject({ record: 'observations[2]', path: 'side' });
    expect(await dumpAll(store)).toEqual(before);
  });

  it('a full disk part-way through leaves nothing half-written', async () => {
    const fault = quotaFault(2);
    const { store, assessment, observations, traces } = await withPatient({ middleware: [fault] });
    const before = await dumpAll(store);
    fault.armed = true;
    const error = await saveAssessment(store, assessment, observations, traces).catch((e: unknown) => e);
    fault.armed = false;
    expect((error as StoreError).code).toBe('QuotaExceeded');
    expect(await dumpAll(store)).toEqual(before);
  });
});
