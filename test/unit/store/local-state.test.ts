import { describe, expect, it } from 'vitest';
import { StoreError, exportBackupText, readLocalState, writeLocalState } from '../../../src/lib/store';
import { freshStore } from './store-helpers';

describe('device-local state', () => {
  it('saves and reads plain JSON under local: keys, and survives reopening', async () => {
    const store = await freshStore();
    expect(await readLocalState(store, 'local:device-profile')).toBeUndefined();
    await writeLocalState(store, 'local:device-profile', { mode: 'patient', patientId: null });
    expect(await readLocalState(store, 'local:device-profile')).toEqual({ mode: 'patient', patientId: null });
    store.close();
    const again = await freshStore({ indexedDB: store.factory });
    expect(await readLocalState(again, 'local:device-profile')).toEqual({ mode: 'patient', patientId: null });
    again.close();
  });

  it('refuses keys that could overwrite the vault, actor or settings, and non-JSON values', async () => {
    const store = await freshStore();
    for (const key of ['vault', 'actor', 'settings', 'local:', 'local:Bad Key']) {
      await expect(writeLocalState(store, key, 1)).rejects.toThrow(StoreError);
    }
    await expect(writeLocalState(store, 'local:x', { n: Number.NaN })).rejects.toMatchObject({ code: 'ValidationFailed' });
    await expect(writeLocalState(store, 'local:x', new Date(0))).rejects.toMatchObject({ code: 'ValidationFailed' });
    expect(store.vault.status).toBe('unlocked');
    store.close();
  });

  it('never travels in a backup', async () => {
    const store = await freshStore();
    await writeLocalState(store, 'local:home-log', { secret: 'tick-marker-123' });
    const text = await exportBackupText(store, { protectedContent: 'omit' });
    expect(text).toContain('kinnote-backup');
    expect(text).not.toContain('tick-marker-123');
    store.close();
  });
});
