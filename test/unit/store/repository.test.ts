import { describe, expect, it } from 'vitest';
import { ordinalValue } from '../../../src/lib/domain';
import { isUuidV7 } from '../../../src/lib/domain/uuid-v7';
import { StoreError } from '../../../src/lib/store';
import { dumpAll, freshStore, seedPatient } from './store-helpers';

describe('repository writes', () => {
  it('stamps id, times, device and clinician, and audits in the same write', async () => {
    const store = await freshStore();
    const before = await store.audit.count();
    const { patient } = await seedPatient(store);
    expect(isUuidV7(patient.id)).toBe(true);
    expect(patient.createdAt).toBe(patient.updatedAt);
    expect(patient.deviceId).toBe(store.actor!.deviceId);
    expect(patient.clinicianId).toBe(store.actor!.clinicianId);
    expect(patient.deleted).toBe(false);
    expect(await store.audit.count()).toBe(before + 3);
    const [entry] = await store.audit.forRecord('patients', patient.id);
    expect(entry).toMatchObject({ action: 'create', table: 'patients', recordId: patient.id, before: null, clinicianId: store.actor!.clinicianId });
    expect(entry!.after).toMatchObject({ code: 'K7QM-3XHD' });
    store.close();
  });

  it('refuses an invalid record, names the field and writes nothing', async () => {
    const store = await freshStore();
    const { patient, assessment } = await seedPatient(store);
    const snapshot = await dumpAll(store);
    const bad = {
      patientId: patient.id, assessmentId: assessment.id, takenAt: assessment.performedAt, measureCode: 'rom', siteCode: 'elbow-flexion',
      side: 'left' as const, mode: 'active' as const, instrument: 'inclinometer' as const, value: { kind: 'angle' as const, angleDeg: 1500 }, traceId: null,
    };
    const good = { ...bad, value: { kind: 'angle' as const, angleDeg: 120 } };
    const error = await store.observations.createMany([good, bad]).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(StoreError);
    expect((error as StoreError).code).toBe('ValidationFailed');
    expect((error as StoreError).issues[0]).toMatchObject({ record: 'observations[1]', path: 'value.angleDeg' });
    expect(await dumpAll(store)).toEqual(snapshot);
    store.close();
  });

  it('updates with a later updatedAt, audits before and after, and detects stale edits', async () => {
    const store = await freshStore();
    const { patient } = await seedPatient(store);
    const updated = await store.patients.update(patient.id, { status: 'paused' }, { expectedUpdatedAt: patient.updatedAt });
    expect(updated.status).toBe('paused');
    expect(updated.updatedAt > patient.updatedAt).toBe(true);
    expect(updated.createdAt).toBe(patient.createdAt);
    const history = await store.audit.forRecord('patients', patient.id);
    expect(history.map((h) => h.action)).toEqual(['create', 'update']);
    expect(history[1]!.before).toMatchObject({ status: 'active' });
    expect(history[1]!.after).toMatchObject({ status: 'paused' });
    const stale = await store.patients.update(patient.id, { status: 'discharged' }, { expectedUpdatedAt: patient.updatedAt }).catch((e: unknown) => e);
    expect((stale as StoreError).code).toBe('VersionConflict');
    expect((await store.patients.get(patient.id))!.status).toBe('paused');
    await expect(store.patients.update(patient.id, { deleted: true } as never)).rejects.toMatchObject({ code: 'ValidationFailed' });
    await expect(store.patients.update('0190a0b0-0000-7000-8000-00000000dead', { status: 'active' })).rejects.toMatchObject({ code: 'NotFound' });
    store.close();
  });

  it('soft-deletes and restores (tombstone kept, both audited)', async () => {
    const store = await freshStore();
    const { observation, patient } = await seedPatient(store);
    await store.observations.remove(observation.id);
    expect((await store.observations.get(observation.id))!.deleted).toBe(true);
    expect(await store.observations.byPatient(patient.id)).toHaveLength(0);
    expect(await store.observations.byPatient(patient.id, { includeDeleted: true })).toHaveLength(1);
    await store.observations.restore(observation.id);
    expect(await store.observations.byPatient(patient.id)).toHaveLength(1);
    expect((await store.audit.forRecord('observations', observation.id)).map((a) => a.action)).toEqual(['create', 'delete', 'restore']);
    store.close();
  });

  it('reads a series in time order from the compound index', async () => {
    const store = await freshStore();
    const { patient, assessment } = await seedPatient(store);
    const at = ['2025-05-01T10:00:00.000Z', '2025-04-01T10:00:00.000Z'];
    for (const takenAt of at) {
      await store.observations.create({
        patientId: patient.id, assessmentId: assessment.id, takenAt, measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: ordinalValue('mas', '2'), traceId: null,
      });
    }
    const series = await store.observations.series(patient.id, 'mas');
    expect(series.map((o) => o.takenAt)).toEqual(['2025-03-01T10:00:00.000Z', '2025-04-01T10:00:00.000Z', '2025-05-01T10:00:00.000Z']);
    expect(await store.observations.series(patient.id, 'rom')).toEqual([]);
    store.close();
  });

  it('stores trace samples as Float64Array columns', async () => {
    const store = await freshStore();
    const { patient } = await seedPatient(store);
    const samples = Float64Array.from({ length: 500 }, (_, i) => Math.sin(i / 10));
    const trace = await store.traces.create({ patientId: patient.id, assessmentId: null, kind: 'pendulum-knee-angle', startedAt: '2025-03-01T10:00:00.000Z', sampleRateHz: 100, channels: [{ name: 'knee', unit: 'deg', samples }] });
    const read = await store.traces.get(trace.id);
    expect(read!.channels[0]!.samples).toBeInstanceOf(Float64Array);
    expect(Array.from(read!.channels[0]!.samples)).toEqual(Array.from(samples));
    const [audit] = await store.audit.forRecord('traces', trace.id);
    expect(audit!.after!.channels).toEqual([{ name: 'knee', unit: 'deg', sampleCount: 500 }]);
    store.close();
  });

  it('needs an actor before writing', async () => {
    const { IDBFactory, IDBKeyRange } = await import('fake-indexeddb');
    const { openStore } = await import('../../../src/lib/store');
    const store = await openStore({ indexedDB: new IDBFactory(), IDBKeyRange, kdfIterations: 1000 });
    await expect(store.patients.create({ code: 'K7QM-3XHD', birthYear: 1961, condition: 'stroke', affectedSides: [], status: 'active' })).rejects.toMatchObject({ code: 'ValidationFailed' });
    store.close();
  });
});
