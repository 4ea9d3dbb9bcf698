import { describe, expect, it } from 'vitest';
import { ordinalValue } from '../../../src/lib/domain';
import { saveAssessment, setAssessmentDeleted, StoreError } from '../../../src/lib/store';
import { dumpAll, freshStore, quotaFault } from './store-helpers';

async function withAssessment(options: Parameters<typeof freshStore>[0] = {}) {
  const store = await freshStore(options);
  const patient = await store.patients.create({ code: 'K7QM-3XHD', birthYear: 1970, condition: 'stroke', affectedSides: ['left'], status: 'active' });
  const takenAt = '2025-03-02T10:00:00.000Z';
  const saved = await saveAssessment(
    store,
    { patientId: patient.id, assessorId: store.actor!.clinicianId, performedAt: takenAt, setting: 'home', conditions: { position: null, minutesSinceMedication: null, painNrs: null }, notes: null },
    ['elbow-flexors', 'wrist-flexors'].map((siteCode) => ({ patientId: patient.id, takenAt, measureCode: 'mas', siteCode, side: 'left' as const, mode: null, instrument: null, value: ordinalValue('mas', '2') })),
  );
  return { store, patient, saved };
}

describe('setAssessmentDeleted', () => {
  it('tombstones the assessment and its observations together, audited, and undo restores them', async () => {
    const { store, patient, saved } = await withAssessment();
    const auditBefore = await store.audit.count();
    expect(await setAssessmentDeleted(store, saved.assessment.id, true)).toEqual({ changed: 3 });
    expect(await store.observations.byPatient(patient.id)).toEqual([]);
    expect(await store.assessments.byPatient(patient.id)).toEqual([]);
    expect(await store.audit.count()).toBe(auditBefore + 3);
    expect(await setAssessmentDeleted(store, saved.assessment.id, false)).toEqual({ changed: 3 });
    expect((await store.observations.byPatient(patient.id)).map((o) => o.siteCode).sort()).toEqual(['elbow-flexors', 'wrist-flexors']);
    expect((await store.audit.forRecord('assessments', saved.assessment.id)).map((a) => a.action)).toEqual(['create', 'delete', 'restore']);
  });

  it('a full disk part-way through changes nothing at all', async () => {
    const fault = quotaFault(2);
    const { store, saved } = await withAssessment({ middleware: [fault] });
    const before = await dumpAll(store);
    fault.armed = true;
    const error = await setAssessmentDeleted(store, saved.assessment.id, true).catch((e: unknown) => e);
    fault.armed = false;
    expect(error).toBeInstanceOf(StoreError);
    expect((error as StoreError).code).toBe('QuotaExceeded');
    expect(await dumpAll(store)).toEqual(before);
  });

  it('names an unknown assessment', async () => {
    const { store } = await withAssessment();
    await expect(setAssessmentDeleted(store, '0190a0b0-0000-7000-8000-000000000999', true)).rejects.toThrow(/not found/);
  });
});
