import { describe, expect, it } from 'vitest';
import { loadDemoCaseload } from '../../../src/lib/store/demo-caseload';
import { dumpAll, freshStore, steppingClock } from '../store/store-helpers';

describe('loadDemoCaseload', () => {
  it('loads the demo through the ordinary import; loading again changes nothing', async () => {
    // The demo runs to 2025-06-30: a store whose clock is later takes it (an earlier one would refuse its future stamps).
    const store = await freshStore({ now: steppingClock(Date.UTC(2025, 6, 1)) });
    const report = await loadDemoCaseload(store, { seed: 3 });
    expect(report.counts.patients.inserted).toBe(12);
    const patients = await store.patients.list();
    expect(patients).toHaveLength(12);
    const identity = await store.identities.forPatient(patients[0]!.id);
    expect(identity!.contact).toMatch(/Invented demo person/);
    const series = await store.observations.series(patients[0]!.id, 'mas');
    expect(series.length).toBeGreaterThan(0);
    const snapshot = await dumpAll(store);
    expect((await loadDemoCaseload(store, { seed: 3 })).changed).toBe(false);
    expect(await dumpAll(store)).toEqual(snapshot);
    store.close();
  });
});
