import { describe, expect, it } from 'vitest';
import { pbkdf2Sync, webcrypto } from 'node:crypto';
import { IDBFactory } from 'fake-indexeddb';
import { StoreError } from '../../../src/lib/store';
import { DEFAULT_KDF_ITERATIONS } from '../../../src/lib/store/crypto-box';
import { type Timers } from '../../../src/lib/store/vault';
import { deriveKey, openText, sealText } from '../../../src/lib/store/crypto-box';
import { dumpAll, freshStore, seedPatient } from './store-helpers';

/** Manual timers: the test decides when time passes. */
function manualTimers() {
  let pending: { fn: () => void; at: number; id: number }[] = [];
  let now = 0;
  let nextId = 1;
  const timers: Timers = {
    setTimeout: (fn, ms) => {
      const id = nextId++;
      pending.push({ fn, at: now + ms, id });
      return id;
    },
    clearTimeout: (id) => {
      pending = pending.filter((p) => p.id !== id);
    },
  };
  return {
    timers,
    advance(ms: number) {
      now += ms;
      const due = pending.filter((p) => p.at <= now);
      pending = pending.filter((p) => p.at > now);
      for (const p of due) p.fn();
    },
  };
}

describe('key derivation', () => {
  it('matches PBKDF2-HMAC-SHA256 from node:crypto (oracle) at 600,000 iterations', async () => {
    expect(DEFAULT_KDF_ITERATIONS).toBeGreaterThanOrEqual(600_000);
    const salt = new Uint8Array(16).fill(7);
    const key = await deriveKey('a passphrase', salt, DEFAULT_KDF_ITERATIONS);
    const sealed = await sealText(key, 'hello', 'aad', new Uint8Array(12));
    // The oracle derives the same 32 bytes independently; its key must open what ours sealed.
    const raw = pbkdf2Sync('a passphrase', salt, DEFAULT_KDF_ITERATIONS, 32, 'sha256');
    const oracleKey = await webcrypto.subtle.importKey('raw', raw, 'AES-GCM', false, ['decrypt']);
    expect(await openText(oracleKey as CryptoKey, sealed, 'aad')).toBe('hello');
    await expect(openText(oracleKey as CryptoKey, sealed, 'other aad')).rejects.toThrow();
  }, 30_000);
});

describe('vault', () => {
  it('encrypts identities and notes at rest: no clear text in the database', async () => {
    const store = await freshStore();
    const { patient, assessment } = await seedPatient(store);
    await store.identities.create({ patientId: patient.id, familyName: 'Quillmere', givenName: 'Odile', dateOfBirth: '1961-04-02', contact: '01234 000000' });
    const everything = JSON.stringify(await dumpAll(store));
    for (const secret of ['Quillmere', 'Odile', '1961-04-02', '01234 000000', 'stiffer in the cold']) expect(everything).not.toContain(secret);
    expect((await store.identities.forPatient(patient.id))!.familyName).toBe('Quillmere');
    expect((await store.assessments.open(assessment)).notes).toBe('Invented note: stiffer in the cold');
    store.close();
  });

  it('while locked, names and notes cannot be read or written; clinical values can', async () => {
    const store = await freshStore();
    const { patient, assessment } = await seedPatient(store);
    await store.identities.create({ patientId: patient.id, familyName: 'Quillmere', givenName: 'Odile', dateOfBirth: null, contact: null });
    store.vault.lock();
    expect(store.vault.status).toBe('locked');
    await expect(store.identities.forPatient(patient.id)).rejects.toMatchObject({ code: 'Locked' });
    await expect(store.assessments.open(assessment)).rejects.toMatchObject({ code: 'Locked' });
    expect(store.assessments.redact(assessment)!.notes).toBeNull();
    await expect(store.identities.create({ patientId: patient.id, familyName: 'X', givenName: 'Y', dateOfBirth: null, contact: null })).rejects.toMatchObject({ code: 'Locked' });
    // A change that does not touch the notes needs no key and keeps the sealed notes.
    const changed = await store.assessments.update(assessment.id, { setting: 'home' });
    expect(changed.notesSealed).toEqual(assessment.notesSealed);
    expect(await store.observations.series(patient.id, 'mas')).toHaveLength(1);
    await store.vault.unlock('correct horse battery');
    expect((await store.assessments.open(changed)).notes).toBe('Invented note: stiffer in the cold');
    store.close();
  });

  it('a wrong passphrase gives a clear error and overwrites nothing', async () => {
    const store = await freshStore();
    store.vault.lock();
    const before = await dumpAll(store);
    const error = await store.vault.unlock('wrong horse battery').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(StoreError);
    expect((error as StoreError).code).toBe('WrongPassphrase');
    expect((error as Error).message).toMatch(/wrong passphrase/);
    await expect(store.vault.changePassphrase('wrong horse battery', 'new passphrase 1')).rejects.toMatchObject({ code: 'WrongPassphrase' });
    expect(await dumpAll(store)).toEqual(before);
    expect(store.vault.status).toBe('locked');
    store.close();
  });

  it('changes the passphrase without re-encrypting records, and survives a reopen', async () => {
    const factory = new IDBFactory();
    const store = await freshStore({ indexedDB: factory });
    const { assessment } = await seedPatient(store);
    await store.vault.changePassphrase('correct horse battery', 'a brand new phrase');
    store.close();
    const reopened = await freshStore({ indexedDB: factory, passphrase: null });
    expect(reopened.vault.status).toBe('locked');
    await expect(reopened.vault.unlock('correct horse battery')).rejects.toMatchObject({ code: 'WrongPassphrase' });
    await reopened.vault.unlock('a brand new phrase');
    expect((await reopened.assessments.open((await reopened.assessments.get(assessment.id))!)).notes).toContain('stiffer');
    reopened.close();
  });

  it('locks after the idle timeout, and activity postpones it', async () => {
    const clock = manualTimers();
    const store = await freshStore({ timers: clock.timers, idleTimeoutMs: 60_000 });
    const statuses: string[] = [];
    store.vault.subscribe((s) => statuses.push(s));
    expect(store.vault.status).toBe('unlocked');
    clock.advance(50_000);
    store.vault.touch();
    clock.advance(50_000);
    expect(store.vault.status).toBe('unlocked');
    clock.advance(10_001);
    expect(store.vault.status).toBe('locked');
    expect(statuses).toEqual(['locked']);
    await store.setIdleTimeoutMs(1000);
    expect(store.settings.idleTimeoutMs).toBe(1000);
    store.close();
  });

  it('refuses short passphrases and a second setup', async () => {
    const store = await freshStore({ passphrase: null });
    expect(store.vault.status).toBe('unset');
    await expect(store.assessments.create({
      patientId: store.actor!.clinicianId, assessorId: store.actor!.clinicianId, performedAt: '2025-03-01T10:00:00.000Z', setting: 'clinic',
      conditions: { position: null, minutesSinceMedication: null, painNrs: null }, notes: 'x',
    })).rejects.toMatchObject({ code: 'Locked' });
    await expect(store.vault.setup('short')).rejects.toMatchObject({ code: 'ValidationFailed' });
    await store.vault.setup('long enough phrase');
    await expect(store.vault.setup('long enough phrase')).rejects.toMatchObject({ code: 'ValidationFailed' });
    store.close();
  });

  it('binds ciphertext to its record: notes moved to another assessment do not open', async () => {
    const store = await freshStore();
    const a = await seedPatient(store, 'AAAA-2222');
    const b = await seedPatient(store, 'BBBB-3333');
    const moved = { ...b.assessment, notesSealed: a.assessment.notesSealed };
    await expect(store.assessments.open(moved)).rejects.toMatchObject({ code: 'Unknown' });
    store.close();
  });
});
