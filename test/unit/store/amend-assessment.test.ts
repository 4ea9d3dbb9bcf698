import { describe, expect, it } from 'vitest';
import { ordinalValue } from '../../../src/lib/domain';
import { amendAssessment, saveAssessment, StoreError } from '../../../src/lib/store';
import { dumpAll, freshStore } from './store-helpers';

const FORM = ['mas', 'tardieu', 'rom', 'penn-spasm-frequency', 'spasm-severity'];

async function savedVisit() {
  const store = await freshStore();
  const patient = await store.patients.create({ code: 'K7QM-3XHD', birthYear: 1970, condition: 'stroke', affectedSides: ['left'], status: 'active' });
  const performedAt = '2025-03-02T10:00:00.000Z';
  const common = { patientId: patient.id, takenAt: performedAt, mode: null, instrument: null };
  const saved = await saveAssessment(
    store,
    { patientId: patient.id, assessorId: store.actor!.clinicianId, performedAt, setting: 'home', conditions: { position: null, minutesSinceMedication: null, painNrs: 2 }, notes: null },
    [
      { ...common, measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', value: ordinalValue('mas', '2') },
      { ...common, measureCode: 'mas', siteCode: 'wrist-flexors', side: 'left', value: ordinalValue('mas', '1') },
      { ...common, measureCode: 'rom', siteCode: 'ankle-dorsiflexion', side: 'left', mode: 'passive', instrument: 'universal-goniometer', value: { kind: 'angle', angleDeg: -10 } },
      { ...common, measureCode: 'pendulum-ri', siteCode: 'knee', side: 'left', value: { kind: 'index', value: 1.2 } },
    ],
  );
  return { store, patient, saved };
}

describe('amendAssessment', () => {
  it('changes, removes and adds observations with one audited entry each, naming the reason, old and new values', async () => {
    const { store, patient, saved } = await savedVisit();
    const auditBefore = await store.audit.count();
    const result = await amendAssessment(store, saved.assessment.id, {
      expectedUpdatedAt: saved.assessment.updatedAt,
      reason: 'grade typed on the wrong muscle',
      assessmentPatch: { conditions: { position: null, minutesSinceMedication: null, painNrs: 3 } },
      observations: [
        { measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: ordinalValue('mas', '1+') },
        { measureCode: 'mas', siteCode: 'wrist-flexors', side: 'left', mode: null, instrument: null, value: ordinalValue('mas', '1') },
        { measureCode: 'mas', siteCode: 'finger-flexors', side: 'left', mode: null, instrument: null, value: ordinalValue('mas', '0') },
      ],
      formMeasures: FORM,
    });
    // 1 update (elbow), 1 tombstone (ROM), 1 create (fingers); wrist unchanged; pendulum untouched.
    expect(result.changed).toBe(3);
    const rows = await store.observations.byPatient(patient.id, { includeDeleted: true });
    const find = (site: string) => rows.find((r) => r.siteCode === site)!;
    expect(find('elbow-flexors').value).toEqual(ordinalValue('mas', '1+'));
    expect(find('ankle-dorsiflexion').deleted).toBe(true);
    expect(find('finger-flexors').deleted).toBe(false);
    expect(find('knee').updatedAt).toBe(find('knee').createdAt);
    expect(find('wrist-flexors').updatedAt).toBe(find('wrist-flexors').createdAt);

    const entries = await store.audit.recent((await store.audit.count()) - auditBefore);
    expect(entries).toHaveLength(4);
    expect(entries.map((e) => `${e.action} ${e.table}`).sort()).toEqual(['create observations', 'delete observations', 'update assessments', 'update observations']);
    for (const e of entries) expect(e.note).toBe('amended: grade typed on the wrong muscle');
    const elbow = entries.find((e) => e.recordId === find('elbow-flexors').id)!;
    expect((elbow.before as { value: unknown }).value).toEqual(ordinalValue('mas', '2'));
    expect((elbow.after as { value: unknown }).value).toEqual(ordinalValue('mas', '1+'));
    const visit = entries.find((e) => e.table === 'assessments')!;
    expect((visit.before as { conditions: { painNrs: number } }).conditions.painNrs).toBe(2);
    expect((visit.after as { conditions: { painNrs: number } }).conditions.painNrs).toBe(3);
  });

  it('refuses a stale form (the visit changed since it was opened) and an empty reason, writing nothing', async () => {
    const { store, saved } = await savedVisit();
    await store.assessments.update(saved.assessment.id, { setting: 'clinic' });
    const before = await dumpAll(store);
    const change = { reason: 'typo', assessmentPatch: { setting: 'home' as const }, observations: [], formMeasures: FORM };
    const stale = await amendAssessment(store, saved.assessment.id, { ...change, expectedUpdatedAt: saved.assessment.updatedAt }).catch((e: unknown) => e);
    expect((stale as StoreError).code).toBe('VersionConflict');
    const current = (await store.assessments.get(saved.assessment.id))!;
    const noReason = await amendAssessment(store, saved.assessment.id, { ...change, reason: '  ', expectedUpdatedAt: current.updatedAt }).catch((e: unknown) => e);
    expect((noReason as StoreError).code).toBe('ValidationFailed');
    expect(await dumpAll(store)).toEqual(before);
  });
});
