import { describe, expect, it } from 'vitest';
import { TABLE_NAMES, ordinalValue } from '../../../src/lib/domain';
import { canonicalJson, exportBackupText, importBackup, readBackup, serializeBundle, StoreError } from '../../../src/lib/store';
import { exportBackup } from '../../../src/lib/store/export-backup';
import { sha256Hex } from '../../../src/lib/store/crypto-box';
import { type BackupBundle } from '../../../src/lib/store/backup-bundle';
import { dumpAll, freshStore, seedPatient, TEST_ITERATIONS } from './store-helpers';
import { tableRows } from '../../../src/lib/store/table-rows';

const withoutAudit = (b: BackupBundle) => Object.fromEntries(TABLE_NAMES.filter((t) => t !== 'audit').map((t) => [t, b.tables[t]]));

/** Re-signs an edited bundle so that the test reaches the record checks behind the checksum. */
async function resign(bundle: BackupBundle): Promise<BackupBundle> {
  const { checksum: _c, ...body } = bundle;
  return { ...body, checksum: { algorithm: 'SHA-256', value: await sha256Hex(canonicalJson(body)) } };
}

describe('backup export and import', () => {
  it('round trip: export, import into an empty store, export again gives the same records', async () => {
    const a = await freshStore();
    const { patient } = await seedPatient(a);
    await a.identities.create({ patientId: patient.id, familyName: 'Lanternby', givenName: 'Wim', dateOfBirth: null, contact: null });
    await a.traces.create({ patientId: patient.id, assessmentId: null, kind: 'other', startedAt: '2025-03-01T10:00:00.000Z', sampleRateHz: 50, channels: [{ name: 'x', unit: 'deg', samples: Float64Array.from([0.1, -0, Number.MAX_VALUE, 5e-324]) }] });
    const { observation } = await seedPatient(a, 'ZZZZ-9999');
    await a.observations.remove(observation.id);
    const first = await exportBackup(a, { protectedContent: 'include' });
    const b = await freshStore({ passphrase: 'another passphrase' });
    const report = await importBackup(b, serializeBundle(first));
    expect(report.changed).toBe(true);
    expect(report.counts.patients.inserted).toBe(2);
    expect(report.conflicts).toEqual([]);
    const second = await exportBackup(b, { protectedContent: 'include' });
    // B is a device of its own: its device and clinician records are the only extra ones.
    const own = new Set([b.actor!.deviceId, b.actor!.clinicianId]);
    const secondTables = withoutAudit(second);
    for (const t of ['devices', 'clinicians']) secondTables[t] = secondTables[t]!.filter((r) => !own.has(r.id as string));
    expect(secondTables).toEqual(withoutAudit(first));
    // The audit log keeps every original entry and gains one import entry.
    const secondAuditIds = new Set(second.tables.audit.map((e) => e.id));
    for (const entry of first.tables.audit) expect(secondAuditIds.has(entry.id as string)).toBe(true);
    expect(second.tables.audit.filter((e) => e.action === 'import')).toHaveLength(1);
    expect((await b.identities.forPatient(patient.id))!.givenName).toBe('Wim');
    a.close();
    b.close();
  });

  it('importing the same bundle twice changes nothing', async () => {
    const a = await freshStore();
    await seedPatient(a);
    const text = await exportBackupText(a, { protectedContent: 'include' });
    const b = await freshStore();
    await importBackup(b, text);
    const after = await dumpAll(b);
    const again = await importBackup(b, text);
    expect(again.changed).toBe(false);
    expect(await dumpAll(b)).toEqual(after);
    a.close();
    b.close();
  });

  it('merges by id: newer updatedAt wins, each conflict audited and reported, merge converges', async () => {
    const a = await freshStore();
    const { patient } = await seedPatient(a);
    const b = await freshStore();
    await importBackup(b, await exportBackup(a, { protectedContent: 'include' }));
    // Both tablets edit the same patient; B edits later (its clock reads 5 minutes later, within
    // the 10 minutes of clock difference an import allows).
    await a.patients.update(patient.id, { status: 'paused' });
    const bNow = b.context.now;
    Object.assign(b.context, { now: () => bNow() + 300_000 });
    await b.patients.update(patient.id, { status: 'discharged' });
    const fromA = await exportBackup(a, { protectedContent: 'include' });
    const fromB = await exportBackup(b, { protectedContent: 'include' });
    const intoB = await importBackup(b, fromA);
    expect(intoB.conflicts).toEqual([expect.objectContaining({ table: 'patients', recordId: patient.id, winner: 'local', reason: 'newer', alreadyRecorded: false })]);
    expect((await b.patients.get(patient.id))!.status).toBe('discharged');
    const intoA = await importBackup(a, fromB);
    expect(intoA.conflicts[0]).toMatchObject({ winner: 'incoming' });
    expect((await a.patients.get(patient.id))!.status).toBe('discharged');
    const history = await a.audit.forRecord('patients', patient.id);
    const merge = history.find((h) => h.action === 'merge-take-incoming')!;
    expect(merge.before).toMatchObject({ status: 'paused' });
    expect(merge.after).toMatchObject({ status: 'discharged' });
    // Re-importing the stale bundle into B records nothing new.
    const before = await dumpAll(b);
    const repeat = await importBackup(b, fromA);
    expect(repeat.changed).toBe(false);
    expect(repeat.conflicts[0]!.alreadyRecorded).toBe(true);
    expect(await dumpAll(b)).toEqual(before);
    a.close();
    b.close();
  });

  it('a bad record changes nothing and the error names the record and field', async () => {
    const a = await freshStore();
    await seedPatient(a);
    const bundle = await exportBackup(a, { protectedContent: 'include' });
    const obs = bundle.tables.observations[0]!;
    const broken = await resign({ ...bundle, tables: { ...bundle.tables, observations: [{ ...obs, value: { kind: 'ordinal', grade: '7', rank: 7 } }] } });
    const b = await freshStore();
    const before = await dumpAll(b);
    const error = (await importBackup(b, broken).catch((e: unknown) => e)) as StoreError;
    expect(error.code).toBe('InvalidBundle');
    expect(error.issues[0]).toMatchObject({ record: `tables.observations[0] (${obs.id as string})`, path: 'value.grade' });
    expect(error.message).toContain('value.grade');
    expect(await dumpAll(b)).toEqual(before);
    a.close();
    b.close();
  });

  it('refuses an altered bundle by its checksum, and unknown versions', async () => {
    const a = await freshStore();
    await seedPatient(a);
    const bundle = await exportBackup(a, { protectedContent: 'omit' });
    const altered = { ...bundle, tables: { ...bundle.tables, patients: [{ ...bundle.tables.patients[0]!, birthYear: 1900 }] } };
    await expect(readBackup(altered)).rejects.toMatchObject({ code: 'TamperedBundle' });
    await expect(readBackup({ ...bundle, formatVersion: 2 })).rejects.toMatchObject({ code: 'UnsupportedBundle' });
    await expect(readBackup('{"format":"kinnote-backup","formatVer')).rejects.toMatchObject({ code: 'InvalidBundle' });
    await expect(readBackup('[]')).rejects.toMatchObject({ code: 'InvalidBundle' });
    a.close();
  });

  it('checks the checksum on the file text as written, and on any other text of the same bundle', async () => {
    const a = await freshStore();
    const { patient } = await seedPatient(a);
    const text = await exportBackupText(a, { protectedContent: 'omit' });
    const b = await freshStore();
    const before = await dumpAll(b);
    // One digit of the birth year changed in the text (the checksum member left as it was).
    const edited = text.replace('"birthYear":1961', '"birthYear":1962');
    expect(edited).not.toBe(text);
    await expect(importBackup(b, edited)).rejects.toMatchObject({ code: 'TamperedBundle' });
    // A second "tables" member appended after the body: JSON.parse keeps the last one.
    const appended = `${text.trimEnd().slice(0, -1)},"tables":${JSON.stringify({ ...(JSON.parse(text) as BackupBundle).tables, patients: [] })}}`;
    expect(() => JSON.parse(appended) as unknown).not.toThrow();
    await expect(importBackup(b, appended)).rejects.toMatchObject({ code: 'TamperedBundle' });
    expect(await dumpAll(b)).toEqual(before);
    // The same bundle re-indented, or with its members in another order, is no other bundle.
    const parsed = JSON.parse(text) as BackupBundle;
    const reordered = JSON.stringify(Object.assign({ tables: parsed.tables }, parsed), null, 2);
    expect(reordered.startsWith('{\n  "tables"')).toBe(true);
    const report = await importBackup(b, reordered);
    expect(report.counts.patients.inserted).toBe(1);
    expect((await b.patients.get(patient.id))!.birthYear).toBe(1961);
    a.close();
    b.close();
  });

  it('merges a large bundle into a store holding part of it: present, absent, newer and older rows told apart', async () => {
    const a = await freshStore();
    const { patient, assessment } = await seedPatient(a);
    const input = (grade: string) => ({
      patientId: patient.id, assessmentId: assessment.id, takenAt: assessment.performedAt, measureCode: 'mas', siteCode: 'elbow-flexors',
      side: 'left' as const, mode: null, instrument: null, value: ordinalValue('mas', grade), traceId: null,
    });
    const first = await a.observations.createMany(Array.from({ length: 300 }, () => input('1')));
    const b = await freshStore();
    await importBackup(b, await exportBackupText(a, { protectedContent: 'omit' }));
    // A: 40 new observations and one edit; B (clock 5 minutes ahead) edits another one later.
    await a.observations.createMany(Array.from({ length: 40 }, () => input('2')));
    await a.observations.update(first[10]!.id, { value: ordinalValue('mas', '3') });
    Object.assign(b.context, { now: ((n: () => number) => () => n() + 300_000)(b.context.now) });
    await b.observations.update(first[20]!.id, { value: ordinalValue('mas', '4') });
    const report = await importBackup(b, await exportBackupText(a, { protectedContent: 'omit' }));
    // 341 in the bundle: 40 new, 2 edited on one side, the other 299 (the seed observation among them) alike.
    expect(report.counts.observations).toEqual({ inserted: 40, replaced: 1, unchanged: 299, keptLocal: 1 });
    expect((await b.observations.get(first[10]!.id))!.value).toMatchObject({ grade: '3' });
    expect((await b.observations.get(first[20]!.id))!.value).toMatchObject({ grade: '4' });
    expect((await tableRows(b.db, 'observations').all()).length).toBe(341);
    expect(report.conflicts.map((c) => [c.recordId, c.winner]).sort()).toEqual([[first[10]!.id, 'incoming'], [first[20]!.id, 'local']].sort());
    a.close();
    b.close();
  });

  it('exports one patient with what hangs on them', async () => {
    const a = await freshStore();
    const one = await seedPatient(a, 'AAAA-2222');
    await seedPatient(a, 'BBBB-3333');
    const bundle = await exportBackup(a, { protectedContent: 'omit', scope: { kind: 'patient', patientId: one.patient.id } });
    expect(bundle.tables.patients.map((p) => p.code)).toEqual(['AAAA-2222']);
    expect(bundle.tables.observations).toHaveLength(1);
    expect(bundle.tables.clinicians).toHaveLength(1);
    const ids = new Set([one.patient.id, one.assessment.id, one.observation.id, a.actor!.deviceId, a.actor!.clinicianId]);
    expect(bundle.tables.audit.length).toBe(5);
    expect(bundle.tables.audit.every((e) => ids.has(e.recordId as string))).toBe(true);
    await expect(exportBackup(a, { protectedContent: 'omit', scope: { kind: 'patient', patientId: '0190a0b0-0000-7000-8000-000000000000' } })).rejects.toMatchObject({ code: 'NotFound' });
    a.close();
  });

  it('without protected content: no names or notes leave, and local ones are kept on import', async () => {
    const a = await freshStore();
    const { patient, assessment } = await seedPatient(a);
    await a.identities.create({ patientId: patient.id, familyName: 'Lanternby', givenName: 'Wim', dateOfBirth: null, contact: null });
    const b = await freshStore();
    await importBackup(b, await exportBackup(a, { protectedContent: 'include' }));
    await a.assessments.update(assessment.id, { setting: 'remote' });
    const text = await exportBackupText(a, { protectedContent: 'omit' });
    expect(text).not.toContain('Lanternby');
    expect(text).not.toContain('stiffer in the cold');
    a.vault.lock();
    await expect(exportBackup(a, { protectedContent: 'include' })).rejects.toMatchObject({ code: 'Locked' });
    b.vault.lock();
    const report = await importBackup(b, text);
    expect(report.counts.assessments.replaced).toBe(1);
    await b.vault.unlock('correct horse battery');
    const merged = await b.assessments.get(assessment.id);
    expect(merged!.setting).toBe('remote');
    expect((await b.assessments.open(merged!)).notes).toContain('stiffer in the cold');
    expect((await b.identities.forPatient(patient.id))!.familyName).toBe('Lanternby');
    a.close();
    b.close();
  });

  it('importing names into a locked vault is refused before anything is written', async () => {
    const a = await freshStore();
    await seedPatient(a);
    const bundle = await exportBackup(a, { protectedContent: 'include' });
    const b = await freshStore();
    b.vault.lock();
    const before = await dumpAll(b);
    await expect(importBackup(b, bundle)).rejects.toMatchObject({ code: 'Locked' });
    expect(await dumpAll(b)).toEqual(before);
    a.close();
    b.close();
  });

  it('encrypted backups: round trip, wrong passphrase, tampered or truncated refused whole', async () => {
    const a = await freshStore();
    await seedPatient(a);
    const text = await exportBackupText(a, { protectedContent: 'include', passphrase: 'backup passphrase', iterations: TEST_ITERATIONS });
    expect(text).not.toContain('stiffer');
    expect(text).not.toContain('K7QM');
    const b = await freshStore();
    const before = await dumpAll(b);
    await expect(importBackup(b, text)).rejects.toMatchObject({ code: 'WrongPassphrase' });
    await expect(importBackup(b, text, { passphrase: 'not the passphrase' })).rejects.toMatchObject({ code: 'WrongPassphrase' });
    const parsed = JSON.parse(text) as { ciphertext: string };
    const flip = parsed.ciphertext[100] === 'A' ? 'B' : 'A';
    const tampered = JSON.stringify({ ...parsed, ciphertext: parsed.ciphertext.slice(0, 100) + flip + parsed.ciphertext.slice(101) });
    await expect(importBackup(b, tampered, { passphrase: 'backup passphrase' })).rejects.toMatchObject({ code: 'TamperedBundle' });
    const cut = JSON.stringify({ ...parsed, ciphertext: parsed.ciphertext.slice(0, parsed.ciphertext.length - 400) });
    await expect(importBackup(b, cut, { passphrase: 'backup passphrase' })).rejects.toMatchObject({ code: 'TamperedBundle' });
    await expect(importBackup(b, text.slice(0, text.length / 2), { passphrase: 'backup passphrase' })).rejects.toMatchObject({ code: 'InvalidBundle' });
    await expect(importBackup(b, JSON.stringify({ ...parsed, kdf: { ...(parsed as unknown as { kdf: object }).kdf, iterations: 1e9 } }), { passphrase: 'backup passphrase' })).rejects.toMatchObject({ code: 'InvalidBundle' });
    expect(await dumpAll(b)).toEqual(before);
    const report = await importBackup(b, text, { passphrase: 'backup passphrase' });
    expect(report.counts.observations.inserted).toBe(1);
    a.close();
    b.close();
  });
});
