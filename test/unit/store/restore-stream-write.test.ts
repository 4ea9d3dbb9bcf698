// Pass 2 of the streamed restore: pages written through the import's steps with an undo journal. Oracles:
// the whole-file import (importBackup) of the same file for what a finished restore holds, and the store's
// own rows read before the restore for what a cancelled, failed or crashed one must leave.
import { describe, expect, it } from 'vitest';
import { TABLE_NAMES } from '../../../src/lib/domain';
import { exportBackupText, importBackup, tableRows, type KinnoteStore } from '../../../src/lib/store';
import { RESTORE_JOURNAL, recoverInterruptedRestore, restoreBackupStream } from '../../../src/lib/store/restore-stream-write';
import { freshStore, seedPatient, steppingClock } from './store-helpers';

const NOW = Date.UTC(2025, 5, 1, 12);

async function* pieces(text: string, size: number) {
  for (let i = 0; i < text.length; i += size) yield text.slice(i, i + size);
}

/** Every record of every table as stored, by table, in id order; `redacted`: protected text left out (sealed text differs per device key). */
async function records(store: KinnoteStore, options: { audit?: boolean; redacted?: boolean } = {}) {
  const out: Record<string, unknown[]> = {};
  for (const table of TABLE_NAMES) {
    if (table === 'audit' && options.audit === false) continue;
    const rows = await tableRows(store.db, table).all();
    out[table] = options.redacted ? rows.map((r) => store.context.codecs[table].redact(r as never)).filter((r) => r !== null) : rows;
  }
  return out;
}

/** A device with 3 patients, its backup, and a second device that already holds an older copy of one patient. */
async function scene() {
  const step = steppingClock();
  const source = await freshStore({ now: () => step() });
  const seeded = [];
  for (let i = 0; i < 3; i++) seeded.push(await seedPatient(source, `K7Q${String.fromCharCode(65 + i)}-3XHD`));
  const older = await exportBackupText(source, { protectedContent: 'omit' });
  await source.patients.update(seeded[0]!.patient.id, { birthYear: 1962 });
  // A new observation (inserted by the restore into a block the target already has).
  const { id: _id, createdAt: _c, updatedAt: _u, deleted: _d, clinicianId: _cl, deviceId: _dv, ...again } = seeded[1]!.observation;
  await source.observations.create({ ...again, siteCode: 'knee-extensors' });
  const text = await exportBackupText(source, { protectedContent: 'omit' });
  source.close();
  const target = await freshStore({ now: steppingClock(NOW) });
  await importBackup(target, older);
  await seedPatient(target, 'M2RW-8TPK');
  return { text, target };
}

describe('streamed restore, pass 2: pages with an undo journal', () => {
  it('ends with the records the whole-file import gives', async () => {
    const { text, target } = await scene();
    // The oracle: a copy of the target device (its whole backup in a fresh store), then the whole-file import.
    const oracle = await freshStore({ now: steppingClock(NOW) });
    await importBackup(oracle, await exportBackupText(target, { protectedContent: 'include' }));
    await importBackup(oracle, text);
    const progress: string[] = [];
    await restoreBackupStream(target, () => pieces(text, 97), { pageSize: 3, onProgress: (p) => void progress.push(p.phase) });
    const expected = await records(oracle, { audit: false, redacted: true });
    // The oracle device's own clinician and device records are not part of the comparison.
    const own = new Set([oracle.actor!.clinicianId, oracle.actor!.deviceId]);
    for (const table of ['clinicians', 'devices']) expected[table] = expected[table]!.filter((r) => !own.has((r as { id: string }).id));
    expect(await records(target, { audit: false, redacted: true })).toEqual(expected);
    expect((await tableRows(target.db, 'patients').all()).map((p) => (p as unknown as { birthYear: number }).birthYear).sort()).toEqual([1961, 1961, 1961, 1962]);
    // Every audit entry of the file is there (the import's own entries differ: one per page).
    const audit = new Set((await tableRows(target.db, 'audit').all()).map((a) => a.id));
    for (const entry of JSON.parse(text).tables.audit as { id: string }[]) expect(audit.has(entry.id)).toBe(true);
    expect(progress).toContain('checking');
    expect(progress.filter((p) => p === 'writing').length).toBeGreaterThan(2);
    expect(await target.db.table('meta').where('key').startsWith(RESTORE_JOURNAL).count()).toBe(0);
    target.close();
    oracle.close();
  });

  it('cancel after some pages leaves every record as it was, replaced rows included', async () => {
    const { text, target } = await scene();
    const before = await records(target);
    const cancel = new AbortController();
    let pages = 0;
    const run = restoreBackupStream(target, () => pieces(text, 64), {
      pageSize: 2,
      signal: cancel.signal,
      onProgress: (p) => {
        // Cancelled before the last page: patients and observations (late in the file's order) are written by then.
        if (p.phase === 'writing' && ++pages > 0 && p.done >= p.total! - 2) cancel.abort();
      },
    });
    await expect(run).rejects.toMatchObject({ code: 'Aborted' });
    expect(pages).toBeGreaterThan(3);
    expect(await records(target)).toEqual(before);
    target.close();
  });

  it('a restore cut off mid-way (crash, closed tab) is undone when the store is opened again', async () => {
    const { text, target } = await scene();
    const before = await records(target);
    let pages = 0;
    let stalled!: () => void;
    const stall = new Promise<void>((resolve) => (stalled = resolve));
    void restoreBackupStream(target, () => pieces(text, 64), {
      pageSize: 2,
      onProgress: (p) => (p.phase === 'writing' && ++pages > 0 && p.done >= p.total! - 2 ? new Promise<void>(() => stalled()) : undefined),
    }).catch(() => undefined);
    await stall;
    expect(await records(target)).not.toEqual(before);
    target.close();
    const reopened = await freshStore({ indexedDB: target.factory, now: steppingClock(NOW) });
    expect(await recoverInterruptedRestore(reopened)).toBe(true);
    expect(await records(reopened)).toEqual(before);
    expect(await recoverInterruptedRestore(reopened)).toBe(false);
    reopened.close();
  });

  it('a bad file writes nothing at all', async () => {
    const { text, target } = await scene();
    const before = await records(target);
    const broken = text.replace('"measureCode":"mas"', '"measureCode":"nope"');
    await expect(restoreBackupStream(target, () => pieces(broken, 64), { pageSize: 2 })).rejects.toMatchObject({ code: 'TamperedBundle' });
    expect(await records(target)).toEqual(before);
    target.close();
  });
});
