import { describe, expect, it } from 'vitest';
import Dexie from 'dexie';
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import { LATEST_SCHEMA_VERSION, openStore } from '../../../src/lib/store';
import { SCHEMA_VERSIONS, declareSchema } from '../../../src/lib/store/schema';
import { tableRows } from '../../../src/lib/store/table-rows';

const ids = (n: number) => `0190a0b0-0000-7000-8000-${String(n).padStart(12, '0')}`;
const stamps = { createdAt: '2025-01-01T10:00:00.000Z', updatedAt: '2025-01-01T10:00:00.000Z', deviceId: ids(900), clinicianId: ids(901), deleted: false };

/** Version-1 rows as the first release wrote them (observations had no takenAt). */
function v1Rows() {
  const patient = { id: ids(1), ...stamps, code: 'K7QM-3XHD', birthYear: 1960, condition: 'stroke', affectedSides: ['left'], status: 'active' };
  const assessments = [
    { id: ids(2), ...stamps, patientId: ids(1), assessorId: ids(901), performedAt: '2025-01-02T09:00:00.000Z', setting: 'clinic', conditions: { position: null, minutesSinceMedication: null, painNrs: null }, notesSealed: null },
    { id: ids(3), ...stamps, patientId: ids(1), assessorId: ids(901), performedAt: '2025-02-02T09:00:00.000Z', setting: 'home', conditions: { position: null, minutesSinceMedication: null, painNrs: null }, notesSealed: null },
  ];
  const observations = [
    { id: ids(10), ...stamps, patientId: ids(1), assessmentId: ids(2), measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: { kind: 'ordinal', grade: '2', rank: 3 }, traceId: null },
    { id: ids(11), ...stamps, patientId: ids(1), assessmentId: ids(3), measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: { kind: 'ordinal', grade: '1+', rank: 2 }, traceId: null },
    // An orphan (its assessment is missing): v1 did not forbid it; it takes its own createdAt.
    { id: ids(12), ...stamps, patientId: ids(1), assessmentId: ids(99), measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: { kind: 'ordinal', grade: '1', rank: 1 }, traceId: null },
  ];
  const audit = [{ id: ids(50), ...stamps, action: 'create', table: 'patients', recordId: ids(1), before: null, after: { code: 'K7QM-3XHD' }, note: null }];
  const trace = { id: ids(60), ...stamps, patientId: ids(1), assessmentId: ids(2), kind: 'pendulum-knee-angle', startedAt: stamps.createdAt, sampleRateHz: 100, channels: [{ name: 'knee', unit: 'deg', samples: new Float64Array([1, 2, 3]) }] };
  return { patient, assessments, observations, audit, trace };
}

describe('schema migrations', () => {
  it('declares increasing versions from 1, each after the first with an upgrade', () => {
    // Versions are pre-assigned to parallel changes, so a branch may skip one (e.g. 3); never repeat.
    const versions = SCHEMA_VERSIONS.map((v) => v.version);
    expect(versions[0]).toBe(1);
    for (let i = 1; i < versions.length; i++) expect(versions[i]!, `after v${versions[i - 1]}`).toBeGreaterThan(versions[i - 1]!);
    expect(versions[versions.length - 1]).toBe(LATEST_SCHEMA_VERSION);
    for (const v of SCHEMA_VERSIONS.slice(1)) expect(v.upgrade, `v${v.version}`).toBeTypeOf('function');
  });

  it('v1 → v2: every record intact, takenAt backfilled, new indexes usable', async () => {
    const factory = new IDBFactory();
    const rows = v1Rows();
    const old = new Dexie('kinnote', { indexedDB: factory, IDBKeyRange });
    declareSchema(old, 1);
    await old.open();
    expect(old.verno).toBe(1);
    await old.table('patients').add(rows.patient);
    await old.table('assessments').bulkAdd(rows.assessments);
    await old.table('observations').bulkAdd(rows.observations);
    await old.table('audit').bulkAdd(rows.audit);
    await old.table('traces').add(rows.trace);
    await old.table('meta').put({ key: 'actor', value: { deviceId: ids(900), clinicianId: ids(901) } });
    old.close();

    const store = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    expect(store.db.verno).toBe(LATEST_SCHEMA_VERSION);
    expect(await store.patients.get(ids(1))).toEqual(rows.patient);
    expect(await store.assessments.list()).toEqual(rows.assessments);
    const trace = await store.traces.get(ids(60));
    expect(Array.from(trace!.channels[0]!.samples)).toEqual([1, 2, 3]);
    const observations = await store.observations.list();
    expect(observations.map((o) => o.takenAt)).toEqual(['2025-01-02T09:00:00.000Z', '2025-02-02T09:00:00.000Z', stamps.createdAt]);
    for (const [i, o] of observations.entries()) {
      const { takenAt: _t, ...rest } = o;
      expect(rest).toEqual(rows.observations[i]);
    }
    // New compound index answers range queries; the kept patientId index still works.
    expect((await store.observations.series(ids(1), 'mas')).map((o) => o.id)).toEqual([ids(12), ids(10), ids(11)]);
    expect((await tableRows(store.db, 'observations').ofPatient(ids(1))).length).toBe(3);
    expect(await store.audit.forRecord('patients', ids(1))).toEqual(rows.audit);
    expect(store.actor).toEqual({ deviceId: ids(900), clinicianId: ids(901) });
    // Since schema 16 the series is read through the blocks' patient index (observation-rows.ts).
    const schema = store.db.table('observations').schema;
    expect(schema.indexes.map((i) => i.name)).toContain('patientIds');
    // Records written after the upgrade still validate against the current schema.
    const { validateRecord } = await import('../../../src/lib/domain');
    for (const o of observations) expect(validateRecord('observations', o).ok).toBe(true);
    store.close();
  });

  it('v2 → v5: unused indexes dropped, every record and the indexes still read intact', async () => {
    const factory = new IDBFactory();
    const rows = v1Rows();
    const observations = rows.observations.map((o, i) => ({ ...o, takenAt: `2025-01-0${i + 2}T09:00:00.000Z` }));
    const old = new Dexie('kinnote', { indexedDB: factory, IDBKeyRange });
    declareSchema(old, 2);
    await old.open();
    expect(old.verno).toBe(2);
    await old.table('patients').add(rows.patient);
    await old.table('assessments').bulkAdd(rows.assessments);
    await old.table('observations').bulkAdd(observations);
    await old.table('audit').bulkAdd(rows.audit);
    await old.table('traces').add(rows.trace);
    old.close();

    const store = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    expect(store.db.verno).toBe(LATEST_SCHEMA_VERSION);
    const names = (table: string) => new Set(store.db.backendDB().transaction(table).objectStore(table).indexNames);
    // assessmentId and measureCode are dropped; since schema 16 observations are packed, indexed by each
    // block's patients and newest updatedAt (the team sync reads it).
    expect(names('observations')).toEqual(new Set(['patientIds', 'changedAt']));
    expect(names('audit')).toEqual(new Set(['createdAt', '[table+recordId]']));
    expect(await store.observations.list()).toEqual(observations);
    expect(await store.assessments.list()).toEqual(rows.assessments);
    expect(await store.patients.get(ids(1))).toEqual(rows.patient);
    expect(Array.from((await store.traces.get(ids(60)))!.channels[0]!.samples)).toEqual([1, 2, 3]);
    expect((await store.observations.series(ids(1), 'mas')).map((o) => o.id)).toEqual([ids(10), ids(11), ids(12)]);
    expect((await store.observations.byPatient(ids(1))).map((o) => o.id)).toEqual([ids(10), ids(11), ids(12)]);
    expect(await store.audit.forRecord('patients', ids(1))).toEqual(rows.audit);
    store.close();
  });

  it('v2 → v6: home-programme items gain a dose; Kinnote-written lines are read, free text is kept and never guessed', async () => {
    const factory = new IDBFactory();
    const old = new Dexie('kinnote', { indexedDB: factory, IDBKeyRange });
    declareSchema(old, 2);
    await old.open();
    const freeText = [
      { name: 'Calf stretch against a wall', dosage: '3 × 30 s each side' },
      { name: 'Sit-to-stand practice', dosage: '2 sets of 8' },
      { name: 'Resting splint overnight', dosage: 'nightly as tolerated' },
      // Looks like a Kinnote line but breaks the dose rules (7 a day): stays free text.
      { name: 'Too often', dosage: '7 times a day' },
    ];
    const written = [
      { name: 'A', dosage: 'hold 30 s · 3 repetitions · 2 sets · 2 times a day · caution: stop if the knee hurts' },
      { name: 'B', dosage: '10 repetitions · 3 times a week' },
    ];
    const programme = { id: ids(70), ...stamps, patientId: ids(1), title: 'Home', items: [...freeText, ...written], sessionsPerWeek: 5, startsOn: '2025-01-01', endsOn: null };
    await old.table('homeProgrammes').add(programme);
    old.close();

    const store = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    const after = await store.homeProgrammes.get(ids(70));
    // Every old text is kept exactly.
    expect(after!.items.map((i) => i.dosage)).toEqual([...freeText, ...written].map((i) => i.dosage));
    expect(after!.items.map((i) => i.name)).toEqual([...freeText, ...written].map((i) => i.name));
    // Free text gets no dose (hand-worked: none of these is a line Kinnote wrote).
    expect(after!.items.slice(0, 4).map((i) => i.dose)).toEqual([null, null, null, null]);
    // Kinnote-written lines read back field by field (hand-worked from the text above).
    expect(after!.items[4]!.dose).toEqual({ holdSeconds: 30, repetitions: 3, sets: 2, durationMinutes: null, overnight: false, timesPerDay: 2, daysPerWeek: 7, note: 'caution: stop if the knee hurts' });
    expect(after!.items[5]!.dose).toEqual({ holdSeconds: null, repetitions: 10, sets: null, durationMinutes: null, overnight: false, timesPerDay: 1, daysPerWeek: 3, note: '' });
    expect(after!.sessionsPerWeek).toBe(5);
    const { validateRecord } = await import('../../../src/lib/domain');
    expect(validateRecord('homeProgrammes', after).ok).toBe(true);
    store.close();
  });

  it('v6 → v8: an exercisePhotos table indexed by programme; every earlier record intact', async () => {
    const factory = new IDBFactory();
    const old = new Dexie('kinnote', { indexedDB: factory, IDBKeyRange });
    declareSchema(old, 6);
    await old.open();
    const dose = { holdSeconds: 30, repetitions: 3, sets: null, durationMinutes: null, overnight: false, timesPerDay: 1, daysPerWeek: 7, note: '' };
    const programme = { id: ids(70), ...stamps, patientId: ids(1), title: 'Home', items: [{ name: 'Calf stretch', dosage: '', dose }], sessionsPerWeek: 7, startsOn: '2025-01-01', endsOn: null };
    await old.table('homeProgrammes').add(programme);
    await old.table('meta').put({ key: 'local:device-profile', value: { mode: 'therapist' } });
    expect(old.tables.map((t) => t.name)).not.toContain('exercisePhotos');
    old.close();

    const store = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    expect(store.db.verno).toBe(LATEST_SCHEMA_VERSION);
    expect(await store.homeProgrammes.get(ids(70))).toEqual(programme);
    expect(await store.db.table('meta').get('local:device-profile')).toEqual({ key: 'local:device-profile', value: { mode: 'therapist' } });
    const photos = store.db.table('exercisePhotos');
    expect(photos.schema.primKey.name).toBe('id');
    expect(photos.schema.indexes.map((i) => i.name)).toEqual(['programmeId']);
    const webp = Uint8Array.from([82, 73, 70, 70, 4, 0, 0, 0, 87, 69, 66, 80, 1, 2]);
    await photos.add({ id: `${ids(70)}:0:1`, programmeId: ids(70), patientId: ids(1), exercise: 0, position: 1, type: 'image/webp', widthPx: 10, heightPx: 10, bytes: webp, addedAtMs: 1 });
    const read = (await photos.where('programmeId').equals(ids(70)).toArray()) as { bytes: Uint8Array }[];
    expect(Array.from(read[0]!.bytes)).toEqual(Array.from(webp));
    store.close();
  });

  it('v10 → v14: a device-local teamBases table keyed by table/id; records intact', async () => {
    const factory = new IDBFactory();
    const old = new Dexie('kinnote', { indexedDB: factory, IDBKeyRange });
    declareSchema(old, 10);
    await old.open();
    const { patient, observations } = v1Rows();
    await old.table('patients').add(patient);
    await old.table('observations').add({ ...observations[0], takenAt: '2025-01-02T09:00:00.000Z' });
    expect(old.tables.map((t) => t.name)).not.toContain('teamBases');
    old.close();

    const store = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    expect(store.db.verno).toBe(LATEST_SCHEMA_VERSION);
    expect(await store.patients.get(ids(1))).toEqual(patient);
    expect((await store.observations.get(ids(10)))?.value).toEqual(observations[0]!.value);
    const bases = store.db.table('teamBases');
    expect(bases.schema.primKey.name).toBe('key');
    expect(await bases.count()).toBe(0);
    await bases.put({ key: `patients/${ids(1)}`, updatedAt: stamps.updatedAt });
    expect(await bases.get(`patients/${ids(1)}`)).toEqual({ key: `patients/${ids(1)}`, updatedAt: stamps.updatedAt });
    store.close();
  });

  it('refuses a database newer than the app as VersionConflict', async () => {
    const factory = new IDBFactory();
    const future = new Dexie('kinnote', { indexedDB: factory, IDBKeyRange });
    future.version(LATEST_SCHEMA_VERSION + 5).stores({ meta: 'key' });
    await future.open();
    future.close();
    await expect(openStore({ indexedDB: factory, IDBKeyRange })).rejects.toMatchObject({ code: 'VersionConflict' });
    // The newer database is left exactly as it was: Dexie must not "patch" it with this app's tables
    // (it would add them and bump the version, printing a SchemaDiff warning).
    const after = new Dexie('kinnote', { indexedDB: factory, IDBKeyRange });
    await after.open();
    expect(after.backendDB().version).toBe((LATEST_SCHEMA_VERSION + 5) * 10);
    expect(Array.from(after.backendDB().objectStoreNames)).toEqual(['meta']);
    after.close();
  });

  it('a first open creates the database at the latest version; the version probe creates nothing', async () => {
    const factory = new IDBFactory();
    const { installedNativeVersion } = await import('../../../src/lib/store/installed-version');
    expect(await installedNativeVersion(factory, 'kinnote')).toBe(0);
    expect((await factory.databases()).map((d) => d.name)).toEqual([]);
    const store = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    expect(store.db.verno).toBe(LATEST_SCHEMA_VERSION);
    store.close();
    expect(await installedNativeVersion(factory, 'kinnote')).toBe(LATEST_SCHEMA_VERSION * 10);
  });
});
