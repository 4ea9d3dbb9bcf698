import { describe, expect, it } from 'vitest';
import { ordinalValue } from '../../../src/lib/domain';
import { importBackup, StoreError, type KinnoteStore } from '../../../src/lib/store';
import { exportBackup } from '../../../src/lib/store/export-backup';

import { dumpAll, freshStore, quotaFault, seedPatient } from './store-helpers';

/** A store opened with the fault layer in place (disarmed until `arm`). */
async function faultyStore(allowed: number) {
  const fault = quotaFault(allowed);
  const store = await freshStore({ middleware: [fault] });
  return Object.assign(store, { fault });
}

async function withFault(store: KinnoteStore & { fault: { armed: boolean } }, action: () => Promise<unknown>) {
  store.fault.armed = true;
  try {
    return await action().then(() => undefined, (e: unknown) => e);
  } finally {
    store.fault.armed = false;
  }
}

describe('quota errors', () => {
  it('a create that fails after its first put leaves neither record nor audit entry', async () => {
    const store = await faultyStore(1);
    const { patient, assessment } = await seedPatient(store);
    const before = await dumpAll(store);
    const error = await withFault(store, () =>
      store.observations.create({ patientId: patient.id, assessmentId: assessment.id, takenAt: assessment.performedAt, measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: ordinalValue('mas', '3'), traceId: null }),
    );
    expect(error).toBeInstanceOf(StoreError);
    expect((error as StoreError).code).toBe('QuotaExceeded');
    expect((error as StoreError).message).toMatch(/out of storage space; nothing was saved/);
    expect(((error as StoreError).cause as Error | undefined)).toBeDefined();
    expect(await dumpAll(store)).toEqual(before);
    store.close();
  });

  it('an update and a bulk create are all or nothing too', async () => {
    const store = await faultyStore(1);
    const { patient } = await seedPatient(store);
    const before = await dumpAll(store);
    expect(((await withFault(store, () => store.patients.update(patient.id, { status: 'paused' }))) as StoreError).code).toBe('QuotaExceeded');
    const inputs = Array.from({ length: 50 }, (_, i) => ({ code: `Q${String(i).padStart(3, '2').replace(/[01]/g, '2')}-2222`, birthYear: 1950, condition: 'stroke' as const, affectedSides: [], status: 'active' as const }));
    expect(((await withFault(store, () => store.patients.createMany(inputs))) as StoreError).code).toBe('QuotaExceeded');
    expect(await dumpAll(store)).toEqual(before);
    store.close();
  });

  it('an import that runs out of space imports nothing', async () => {
    const source = await freshStore();
    await seedPatient(source);
    const bundle = await exportBackup(source, { protectedContent: 'include' });
    const target = await faultyStore(2);
    const before = await dumpAll(target);
    const error = await withFault(target, () => importBackup(target, bundle));
    expect((error as StoreError).code).toBe('QuotaExceeded');
    expect(await dumpAll(target)).toEqual(before);
    source.close();
    target.close();
  });
});
