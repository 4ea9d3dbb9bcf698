// The streamed backup against the whole-file exporter (the oracle: exportBackupText, which builds the
// bundle in memory) and against Node's own SHA-256 (node:crypto, outside the project) for the checksum.
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { TABLE_NAMES } from '../../../src/lib/domain';
import { exportBackupText, importBackup, readBackup, StoreError, tableRows } from '../../../src/lib/store';
import { streamBackup } from '../../../src/lib/store/backup-stream';
import { freshStore, seedPatient, steppingClock } from './store-helpers';

/** A store whose clock can be stopped, so two exports carry the same exportedAt. */
async function storeWithRecords(patients: number) {
  const step = steppingClock();
  let frozen: number | null = null;
  const store = await freshStore({ now: () => frozen ?? step() });
  for (let i = 0; i < patients; i++) {
    const { patient, observation } = await seedPatient(store, `K7Q${String.fromCharCode(65 + i)}-3XHD`);
    await store.identities.create({ patientId: patient.id, familyName: `Invented${i}`, givenName: 'Ré', dateOfBirth: null, contact: null });
    if (i % 2 === 1) await store.observations.remove(observation.id);
  }
  frozen = Date.UTC(2025, 5, 1, 12);
  return store;
}

async function streamed(store: Awaited<ReturnType<typeof storeWithRecords>>, protectedContent: 'include' | 'omit', pageSize: number) {
  const pieces: string[] = [];
  const progress: number[] = [];
  const totals: number[] = [];
  const out = await streamBackup(store, {
    protectedContent,
    pageSize,
    write: (p) => pieces.push(p),
    onProgress: (p) => {
      progress.push(p.done);
      totals.push(p.total);
    },
  });
  return { out, body: pieces.join(''), text: out.head + pieces.join('') + out.tail, progress, totals };
}

describe('streamed backup', () => {
  for (const protectedContent of ['include', 'omit'] as const) {
    it(`writes the exporter's very bytes in pages (${protectedContent} names and notes)`, async () => {
      const store = await storeWithRecords(5);
      const whole = await exportBackupText(store, { protectedContent });
      for (const pageSize of [1, 3, 1000]) {
        const { text, out } = await streamed(store, protectedContent, pageSize);
        expect(text).toBe(whole);
        expect(out.checksum).toBe(JSON.parse(whole).checksum.value);
      }
      store.close();
    });
  }

  it('checksum equals node:crypto SHA-256 of the body, and the file reads back', async () => {
    const store = await storeWithRecords(3);
    const { out, body, text } = await streamed(store, 'include', 2);
    expect(out.checksum).toBe(createHash('sha256').update(`{${body}`).digest('hex'));
    const bundle = await readBackup(text, { now: () => Date.UTC(2025, 5, 1, 12) });
    expect(bundle.tables.patients).toHaveLength(3);
    expect(bundle.tables.identities.map((r) => r.familyName).sort()).toEqual(['Invented0', 'Invented1', 'Invented2']);
    store.close();
  });

  it('a backup without names and notes imports into a new device although its audit names identities', async () => {
    const store = await storeWithRecords(2);
    const { text } = await streamed(store, 'omit', 3);
    const fresh = await freshStore();
    const report = await importBackup(fresh, text);
    expect(report.counts.patients.inserted).toBe(2);
    expect(report.counts.identities.inserted).toBe(0);
    expect((await fresh.db.table('identities').count())).toBe(0);
    store.close();
    fresh.close();
  });

  it('reports progress page by page up to every record, ending at its total', async () => {
    const store = await storeWithRecords(4);
    // The observations' total starts as a bound from keys (4 observations in one block count as 50).
    const { progress, totals, out } = await streamed(store, 'include', 2);
    expect(progress.length).toBeGreaterThan(5);
    for (let i = 1; i < progress.length; i++) expect(progress[i]).toBeGreaterThanOrEqual(progress[i - 1]!);
    for (let i = 0; i < progress.length; i++) expect(totals[i]).toBeGreaterThanOrEqual(progress[i]!);
    expect(progress.at(-1)).toBe(out.records);
    expect(totals.at(-1)).toBe(out.records);
    // The oracle for the total: every table's rows counted one by one.
    let counted = 0;
    for (const table of TABLE_NAMES) counted += await tableRows(store.db, table).count();
    expect(out.records).toBe(counted);
    store.close();
  });

  it('cancel stops with Aborted', async () => {
    const store = await storeWithRecords(3);
    const cancel = new AbortController();
    const run = streamBackup(store, { protectedContent: 'omit', pageSize: 1, write: () => undefined, onProgress: (p) => void (p.done >= 4 && cancel.abort()), signal: cancel.signal });
    await expect(run).rejects.toMatchObject({ code: 'Aborted' });
    store.close();
  });

  it('a write during the backup refuses the file (VersionConflict), never a mix of two moments', async () => {
    const store = await storeWithRecords(2);
    let wrote = false;
    const run = streamBackup(store, {
      protectedContent: 'omit',
      pageSize: 1,
      write: () => undefined,
      onProgress: async () => {
        if (wrote) return;
        wrote = true;
        await seedPatient(store, 'WXYZ-2345');
      },
    });
    await expect(run).rejects.toBeInstanceOf(StoreError);
    await expect(run).rejects.toMatchObject({ code: 'VersionConflict' });
    store.close();
  });

  it('refuses names and notes while the vault is locked', async () => {
    const store = await storeWithRecords(1);
    store.vault.lock();
    await expect(streamBackup(store, { protectedContent: 'include', write: () => undefined })).rejects.toMatchObject({ code: 'Locked' });
    store.close();
  });
});
