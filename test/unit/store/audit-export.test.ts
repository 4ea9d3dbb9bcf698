import { describe, expect, it } from 'vitest';
import { freshStore } from './store-helpers';

describe('audit.logExport', () => {
  it('appends an "export" entry stamped with the device and clinician, with the note', async () => {
    const store = await freshStore();
    const before = await store.audit.count();
    await store.audit.logExport('identified cohort export: 3 patients, long CSV');
    expect(await store.audit.count()).toBe(before + 1);
    const [entry] = await store.audit.recent(1);
    expect(entry).toMatchObject({ action: 'export', table: '*', recordId: null, note: 'identified cohort export: 3 patients, long CSV' });
    expect(entry?.deviceId).toBe(store.actor?.deviceId);
    expect(entry?.clinicianId).toBe(store.actor?.clinicianId);
  });
});
