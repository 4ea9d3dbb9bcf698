import { webcrypto } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { canonicalJson, encryptBundleText, float64ToBase64, importBackup, readBackup, serializeBundle, StoreError } from '../../../src/lib/store';
import { exportBackup } from '../../../src/lib/store/export-backup';
import { sha256Hex } from '../../../src/lib/store/crypto-box';
import { type BackupBundle } from '../../../src/lib/store/backup-bundle';
import { dumpAll, freshStore, seedPatient, TEST_ITERATIONS } from './store-helpers';

type Tables = BackupBundle['tables'];
type Row = Record<string, unknown>;

/** Re-computes the checksum after an edit: anyone can, which is why it proves integrity, not authorship. */
async function resign(bundle: BackupBundle, tables: Partial<Tables>): Promise<BackupBundle> {
  const { checksum: _c, ...body } = { ...bundle, tables: { ...bundle.tables, ...tables } };
  return { ...body, checksum: { algorithm: 'SHA-256', value: await sha256Hex(canonicalJson(body)) } };
}

const randomBytes = (n: number) => webcrypto.getRandomValues(new Uint8Array(n));

/** A source store with two patients (assessment, note, observation each), exported with names and notes. */
async function sourceBundle(scope?: 'first-patient') {
  const a = await freshStore();
  const one = await seedPatient(a);
  const two = await seedPatient(a, 'BBBB-3333');
  await a.identities.create({ patientId: one.patient.id, familyName: 'Lanternby', givenName: 'Wim', dateOfBirth: '1961-04-02', contact: null });
  const bundle = await exportBackup(a, { protectedContent: 'include', ...(scope ? { scope: { kind: 'patient' as const, patientId: one.patient.id } } : {}) });
  a.close();
  return { bundle, one, two };
}

/** Imports into a fresh store and expects a refusal naming `path`, with the store byte-identical afterwards. */
async function expectRefused(input: unknown, path: string | RegExp, options: { passphrase?: string } = {}): Promise<StoreError> {
  const b = await freshStore();
  const before = await dumpAll(b);
  const error = (await importBackup(b, input, options).catch((e: unknown) => e)) as StoreError;
  expect(error).toBeInstanceOf(StoreError);
  expect(error.code).toBe('InvalidBundle');
  expect(error.issues.map((i) => i.path)).toContainEqual(typeof path === 'string' ? path : expect.stringMatching(path));
  expect(await dumpAll(b)).toEqual(before);
  b.close();
  return error;
}

describe('import keeps the database sound', () => {
  it('refuses stamps in the future (beyond 10 minutes of clock difference), before 2000, and createdAt after updatedAt', async () => {
    const { bundle } = await sourceBundle();
    const patient = bundle.tables.patients[0]!;
    const far = await resign(bundle, { patients: [{ ...patient, updatedAt: '9999-12-31T23:59:59.999Z' }, ...bundle.tables.patients.slice(1)] });
    const error = await expectRefused(far, 'updatedAt');
    expect(error.message).toContain('9999-12-31T23:59:59.999Z');
    // The store's test clock starts at 2025-03-01T09:00Z; an hour ahead is refused, 5 minutes ahead accepted.
    await expectRefused(await resign(bundle, { patients: [{ ...patient, updatedAt: '2025-03-01T10:30:00.000Z' }, ...bundle.tables.patients.slice(1)] }), 'updatedAt');
    await expectRefused(await resign(bundle, { patients: [{ ...patient, createdAt: '1999-12-31T23:59:59.999Z' }, ...bundle.tables.patients.slice(1)] }), 'createdAt');
    const swapped = { ...patient, createdAt: patient.updatedAt, updatedAt: '2025-03-01T08:00:00.000Z' };
    await expectRefused(await resign(bundle, { patients: [swapped, ...bundle.tables.patients.slice(1)] }), 'updatedAt');
    const b = await freshStore();
    const nearFuture = await resign(bundle, { patients: [{ ...patient, updatedAt: '2025-03-01T09:05:00.000Z' }, ...bundle.tables.patients.slice(1)] });
    expect((await importBackup(b, nearFuture)).counts.patients.inserted).toBe(2);
    b.close();
  });

  it('refuses references that resolve nowhere or to the wrong table, in plain and encrypted backups', async () => {
    const { bundle, one } = await sourceBundle();
    const elsewhere = await freshStore();
    const stranger = await seedPatient(elsewhere, 'ZZZZ-9999');
    elsewhere.close();
    const obs = bundle.tables.observations[0]!;
    const orphan = { ...obs, patientId: stranger.patient.id, assessmentId: stranger.assessment.id };
    const orphaned = await resign(bundle, { observations: [orphan, ...bundle.tables.observations.slice(1)] });
    const error = await expectRefused(orphaned, 'patientId');
    expect(error.issues.map((i) => i.path)).toContain('assessmentId');
    expect(error.message).toContain(stranger.patient.id);
    // An identity pointing at an observation's id: the id exists, but not as a patient.
    const identity = bundle.tables.identities[0]!;
    const misdirected = await resign(bundle, { identities: [{ ...identity, patientId: one.observation.id }] });
    await expectRefused(misdirected, 'patientId');
    // The same inside an encrypted backup (its tag is genuine: the sender knew the passphrase).
    const sealed = await encryptBundleText(serializeBundle(orphaned), 'backup passphrase', { randomBytes, iterations: TEST_ITERATIONS });
    await expectRefused(sealed, 'patientId', { passphrase: 'backup passphrase' });
  });

  it('accepts references to records already on the device', async () => {
    const a = await freshStore();
    const { patient, assessment } = await seedPatient(a);
    const full = await exportBackup(a, { protectedContent: 'include' });
    const b = await freshStore();
    await importBackup(b, full);
    // A later bundle with only a new observation of that patient: its patient and assessment are on B already.
    const next = await a.observations.create({ patientId: patient.id, assessmentId: assessment.id, takenAt: assessment.performedAt, measureCode: 'mas', siteCode: 'knee-extensors', side: 'left', mode: null, instrument: null, value: { kind: 'ordinal', grade: '2', rank: 3 }, traceId: null });
    const later = await exportBackup(a, { protectedContent: 'include' });
    const onlyNew = await resign(later, Object.fromEntries(Object.keys(later.tables).map((t) => [t, t === 'observations' ? later.tables.observations.filter((o) => o.id === next.id) : []])) as Partial<Tables>);
    expect((await importBackup(b, onlyNew)).counts.observations.inserted).toBe(1);
    a.close();
    b.close();
  });

  it('checks audit entries like records: table name, snapshot size, no protected text, marked as imported', async () => {
    const { bundle } = await sourceBundle();
    const entry = bundle.tables.audit.find((e) => e.table === 'patients')!;
    const withAudit = (e: Row) => resign(bundle, { audit: [...bundle.tables.audit.filter((x) => x.id !== entry.id), e] });
    await expectRefused(await withAudit({ ...entry, table: 'p'.repeat(100_000) }), 'table');
    await expectRefused(await withAudit({ ...entry, table: 'nonsense' }), 'table');
    await expectRefused(await withAudit({ ...entry, after: { ...(entry.after as Row), padding: 'x'.repeat(300_000) } }), 'after');
    await expectRefused(await withAudit({ ...entry, after: { ...(entry.after as Row), familyName: 'Lanternby', dateOfBirth: '1961-04-02' } }), /^after\.(familyName|dateOfBirth)$/);
    await expectRefused(await withAudit({ ...entry, before: { nested: { givenName: 'Wim' } } }), 'before.nested.givenName');
    const assessmentEntry = bundle.tables.audit.find((e) => e.table === 'assessments')!;
    const clearNote = { ...assessmentEntry, after: { ...(assessmentEntry.after as Row), notes: 'Invented note in clear' } };
    await expectRefused(await resign(bundle, { audit: [...bundle.tables.audit.filter((x) => x.id !== assessmentEntry.id), clearNote] }), 'after.notes');

    // A valid entry that claims another author is kept as it claims, marked as taken in by this device.
    const b = await freshStore();
    await importBackup(b, bundle);
    const stored = (await b.db.table('audit').get(entry.id as string)) as Row;
    expect(stored.clinicianId).toBe(entry.clinicianId);
    expect(stored.importedBy).toEqual({ deviceId: b.actor!.deviceId, importedAt: expect.stringMatching(/^2025-/) });
    // The mark is this device's own note: it never travels, and a second import sees no conflict.
    const again = await exportBackup(b, { protectedContent: 'include' });
    expect(again.tables.audit.some((e) => 'importedBy' in e)).toBe(false);
    expect((await importBackup(b, bundle)).changed).toBe(false);
    b.close();
  });

  it('refuses trace samples that are NaN or Infinity', async () => {
    const a = await freshStore();
    const { patient } = await seedPatient(a);
    await a.traces.create({ patientId: patient.id, assessmentId: null, kind: 'other', startedAt: '2025-03-01T10:00:00.000Z', sampleRateHz: 50, channels: [{ name: 'x', unit: 'deg', samples: Float64Array.from([1, 2, 3]) }] });
    const bundle = await exportBackup(a, { protectedContent: 'include' });
    a.close();
    const trace = bundle.tables.traces[0]!;
    const channel = (trace.channels as Row[])[0]!;
    for (const bad of [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) {
      const edited = { ...trace, channels: [{ ...channel, samples: float64ToBase64(Float64Array.from([1, bad, 3])) }] };
      await expectRefused(await resign(bundle, { traces: [edited] }), 'channels.0.samples');
    }
  });

  it('refuses a one-patient backup that holds other patients or their records', async () => {
    const { bundle: scoped } = await sourceBundle('first-patient');
    const { bundle: full } = await sourceBundle();
    expect(scoped.scope.kind).toBe('patient');
    // Twelve patients under a one-patient scope (the other's records come along).
    const extra = full.tables.patients.filter((p) => p.code === 'BBBB-3333');
    await expectRefused(await resign(scoped, { patients: [...scoped.tables.patients, ...extra] }), 'id');
    const foreignObs = full.tables.observations.map((o) => ({ ...o }));
    const error = await expectRefused(await resign(scoped, { patients: [...scoped.tables.patients, ...extra], observations: foreignObs }), 'patientId');
    expect(error.message).toContain('backup of patient');
    // A bundle that really is one patient's is accepted.
    const b = await freshStore();
    expect((await importBackup(b, scoped)).counts.patients.inserted).toBe(1);
    b.close();
  });

  it('reads a backup with a UTF-8 byte-order mark as the browser does', async () => {
    const { bundle } = await sourceBundle();
    const verified = await readBackup(`\uFEFF${serializeBundle(bundle)}`, { now: () => Date.UTC(2025, 2, 1, 9, 5) });
    expect(verified.checksum).toBe(bundle.checksum.value);
  });
});
