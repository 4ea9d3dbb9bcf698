import { describe, expect, it } from 'vitest';
import Dexie from 'dexie';
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import { EMPTY_DOSE, ordinalValue } from '../../../src/lib/domain';
import { planToProgrammeInput } from '../../../src/lib/programme';
import { CHANGED_ELSEWHERE, LATEST_SCHEMA_VERSION, draftsFor, moveLegacyDrafts, openStore, saveAssessment, setAssessmentDeleted, takeOverDraft, writeDraft, type StoreError } from '../../../src/lib/store';
import { LEGACY_TAB_ID, draftId } from '../../../src/lib/store/drafts';
import { declareSchema } from '../../../src/lib/store/schema';
import { dumpAll, freshStore, quotaFault, steppingClock, TEST_ITERATIONS } from './store-helpers';

async function withPatient(options: Parameters<typeof freshStore>[0] = {}) {
  const store = await freshStore(options);
  const patient = await store.patients.create({ code: 'K7QM-3XHD', birthYear: 1970, condition: 'stroke', affectedSides: ['left'], status: 'active' });
  const assessment = {
    patientId: patient.id,
    assessorId: store.actor!.clinicianId,
    performedAt: '2025-03-02T10:00:00.000Z',
    setting: 'home' as const,
    conditions: { position: null, minutesSinceMedication: null, painNrs: null },
    notes: null,
  };
  const observations = [
    { patientId: patient.id, takenAt: assessment.performedAt, measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left' as const, mode: null, instrument: null, value: ordinalValue('mas', '2') },
  ];
  return { store, patient, assessment, observations };
}

/** A Web Storage stand-in (Node has none). */
function memoryStorage(entries: Record<string, string>) {
  const map = new Map(Object.entries(entries));
  return {
    get length() {
      return map.size;
    },
    key: (i: number) => [...map.keys()][i] ?? null,
    getItem: (k: string) => map.get(k) ?? null,
    removeItem: (k: string) => void map.delete(k),
    keys: () => [...map.keys()],
  };
}

const plan = {
  title: 'Invented stretching plan',
  startsOn: '2025-03-01',
  endsOn: null,
  exercises: [{ name: 'Calf stretch at the wall', dose: { ...EMPTY_DOSE, holdSeconds: 30, repetitions: 3, sets: 1, timesPerDay: 2 }, dosageText: '' }],
};

describe('drafts in IndexedDB', () => {
  it('a saved assessment removes its draft in the same transaction; other tabs\u2019 drafts stay', async () => {
    const { store, patient, assessment, observations } = await withPatient();
    const mine = await writeDraft(store, { form: 'assessment', subjectId: patient.id, tabId: 'tab-a', savedAtMs: 1, content: { grade: '2' } });
    await writeDraft(store, { form: 'assessment', subjectId: patient.id, tabId: 'tab-b', savedAtMs: 2, content: { grade: '1' } });
    expect((await draftsFor(store, 'assessment', patient.id)).map((d) => d.tabId)).toEqual(['tab-b', 'tab-a']);
    await saveAssessment(store, assessment, observations, [], { draftId: mine.id });
    expect((await draftsFor(store, 'assessment', patient.id)).map((d) => d.tabId)).toEqual(['tab-b']);
    expect(await store.assessments.byPatient(patient.id)).toHaveLength(1);
  });

  it('a save that fails keeps the draft and writes nothing (all or nothing)', async () => {
    const fault = quotaFault(1);
    const { store, patient, assessment, observations } = await withPatient({ middleware: [fault] });
    const mine = await writeDraft(store, { form: 'assessment', subjectId: patient.id, tabId: 'tab-a', savedAtMs: 1, content: { grade: '2' } });
    const before = await dumpAll(store);
    fault.armed = true;
    const error = await saveAssessment(store, assessment, observations, [], { draftId: mine.id }).catch((e: unknown) => e);
    fault.armed = false;
    expect((error as StoreError).code).toBe('QuotaExceeded');
    expect(await dumpAll(store)).toEqual(before);
  });

  it('a repository create or update removes the draft it was given, in its own transaction', async () => {
    const { store, patient } = await withPatient();
    const tabA = await writeDraft(store, { form: 'programme', subjectId: patient.id, tabId: 'tab-a', savedAtMs: 1, content: { title: 'x' } });
    const programme = await store.homeProgrammes.create(planToProgrammeInput(plan, patient.id), { draftId: tabA.id, firstForPatient: true });
    expect(await draftsFor(store, 'programme', patient.id)).toEqual([]);
    const again = await writeDraft(store, { form: 'programme', subjectId: patient.id, tabId: 'tab-a', savedAtMs: 2, content: { title: 'y' } });
    await store.homeProgrammes.update(programme.id, { title: 'Renamed' }, { expectedUpdatedAt: programme.updatedAt, draftId: again.id });
    expect(await draftsFor(store, 'programme', patient.id)).toEqual([]);
  });

  it('refuses content that is not plain JSON and a malformed form name', async () => {
    const { store, patient } = await withPatient();
    await expect(writeDraft(store, { form: 'assessment', subjectId: patient.id, tabId: 't', savedAtMs: 1, content: { at: new Date(0) } })).rejects.toMatchObject({ code: 'ValidationFailed' });
    await expect(writeDraft(store, { form: 'Assessment Form', subjectId: patient.id, tabId: 't', savedAtMs: 1, content: {} })).rejects.toMatchObject({ code: 'ValidationFailed' });
  });

  it('a tab takes over a draft left by a closed tab, replacing its own', async () => {
    const { store, patient } = await withPatient();
    const old = await writeDraft(store, { form: 'assessment', subjectId: patient.id, tabId: 'closed', savedAtMs: 5, content: { grade: '3' } });
    await writeDraft(store, { form: 'assessment', subjectId: patient.id, tabId: 'here', savedAtMs: 6, content: { grade: '0' } });
    const moved = await takeOverDraft(store, old.id, 'here');
    expect(moved).toMatchObject({ id: draftId('assessment', patient.id, 'here'), content: { grade: '3' }, savedAtMs: 5 });
    expect(await draftsFor(store, 'assessment', patient.id)).toEqual([moved]);
    expect(await takeOverDraft(store, old.id, 'here')).toBeNull();
  });
});

describe('schema v4 and the move from localStorage', () => {
  it('v2 → v4: records intact, drafts table with its index, localStorage drafts moved over once', async () => {
    const factory = new IDBFactory();
    const old = new Dexie('kinnote', { indexedDB: factory, IDBKeyRange });
    declareSchema(old, 2);
    await old.open();
    const stamps = { createdAt: '2025-01-01T10:00:00.000Z', updatedAt: '2025-01-01T10:00:00.000Z', deviceId: 'd', clinicianId: 'c', deleted: false };
    const patient = { id: '0190a0b0-0000-7000-8000-000000000001', ...stamps, code: 'K7QM-3XHD', birthYear: 1960, condition: 'stroke', affectedSides: ['left'], status: 'active' };
    await old.table('patients').add(patient);
    await old.table('meta').put({ key: 'actor', value: { deviceId: 'd', clinicianId: 'c' } });
    old.close();

    const store = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: TEST_ITERATIONS, idleTimeoutMs: null, now: steppingClock() });
    expect(store.db.verno).toBe(LATEST_SCHEMA_VERSION);
    expect(await store.patients.get(patient.id)).toEqual(patient);
    expect(store.db.table('drafts').schema.indexes.map((i) => i.name)).toEqual(['[form+subjectId]']);

    // As the earlier assessment page wrote it (draft-storage.ts before v4), plus an unreadable one.
    const legacy = { draft: { version: 1, patientId: patient.id, painNrs: '4', mas: [] }, sealedNotes: null, savedAtMs: 1_700_000_000_000 };
    const storage = memoryStorage({ [`kinnote.draft.${patient.id}`]: JSON.stringify(legacy), 'kinnote.draft.broken': '{', 'other.key': 'kept' });
    expect(await moveLegacyDrafts(store, storage)).toBe(1);
    const [moved] = await draftsFor(store, 'assessment', patient.id);
    expect(moved).toEqual({
      id: draftId('assessment', patient.id, LEGACY_TAB_ID),
      form: 'assessment',
      subjectId: patient.id,
      tabId: LEGACY_TAB_ID,
      savedAtMs: legacy.savedAtMs,
      content: { draft: legacy.draft, sealedNotes: null },
    });
    expect(storage.keys()).toEqual(['kinnote.draft.broken', 'other.key']);

    // Once: a removal from localStorage that never reached disk must not bring back a draft that
    // was saved or discarded since.
    await store.db.table('drafts').clear();
    const stale = memoryStorage({ [`kinnote.draft.${patient.id}`]: JSON.stringify(legacy) });
    expect(await moveLegacyDrafts(store, stale)).toBe(0);
    expect(await draftsFor(store, 'assessment', patient.id)).toEqual([]);
    expect(stale.keys()).toEqual([]);
    store.close();
  });

  it('a database created at v4 has nothing to move', async () => {
    const store = await freshStore();
    const storage = memoryStorage({ 'kinnote.draft.x': JSON.stringify({ draft: { patientId: 'x' }, savedAtMs: 1 }) });
    expect(await moveLegacyDrafts(store, storage)).toBe(0);
    expect(await store.db.table('drafts').count()).toBe(0);
  });
});

describe('optimistic concurrency between tabs', () => {
  /** Two stores on one database: two tabs of the same browser. */
  async function twoTabs() {
    const a = await freshStore();
    const b = await openStore({ name: 'kinnote-test', indexedDB: a.factory, IDBKeyRange, kdfIterations: TEST_ITERATIONS, idleTimeoutMs: null, now: steppingClock(Date.UTC(2025, 2, 1, 9, 30)) });
    await b.vault.unlock('correct horse battery');
    const patient = await a.patients.create({ code: 'K7QM-3XHD', birthYear: 1970, condition: 'stroke', affectedSides: ['left'], status: 'active' });
    return { a, b, patient };
  }

  it('a stale programme save is refused with the reload message and overwrites nothing', async () => {
    const { a, b, patient } = await twoTabs();
    const first = await a.homeProgrammes.create(planToProgrammeInput(plan, patient.id));
    const readByB = (await b.homeProgrammes.byPatient(patient.id))[0]!;
    await a.homeProgrammes.update(first.id, { title: 'Edited in tab A' }, { expectedUpdatedAt: first.updatedAt });
    const error = (await b.homeProgrammes.update(readByB.id, { title: 'Stale edit in tab B' }, { expectedUpdatedAt: readByB.updatedAt }).catch((e: unknown) => e)) as StoreError;
    expect(error.code).toBe('VersionConflict');
    expect(error.message).toContain(CHANGED_ELSEWHERE);
    expect((await a.homeProgrammes.get(first.id))!.title).toBe('Edited in tab A');
    expect((await a.audit.forRecord('homeProgrammes', first.id)).map((e) => e.action)).toEqual(['create', 'update']);
  });

  it('two tabs creating the first programme at once give one programme, the other refused', async () => {
    const { a, b, patient } = await twoTabs();
    const results = await Promise.allSettled([
      a.homeProgrammes.create(planToProgrammeInput(plan, patient.id), { firstForPatient: true }),
      b.homeProgrammes.create({ ...planToProgrammeInput(plan, patient.id), title: 'From tab B' }, { firstForPatient: true }),
    ]);
    expect(results.map((r) => r.status).sort()).toEqual(['fulfilled', 'rejected']);
    const refused = results.find((r) => r.status === 'rejected') as PromiseRejectedResult;
    expect(refused.reason).toMatchObject({ code: 'VersionConflict' });
    expect(await a.homeProgrammes.byPatient(patient.id)).toHaveLength(1);
  });

  it('a stale delete of an assessment is refused and nothing is tombstoned', async () => {
    const { a, b, patient } = await twoTabs();
    const saved = await saveAssessment(a, { patientId: patient.id, assessorId: a.actor!.clinicianId, performedAt: '2025-03-02T10:00:00.000Z', setting: 'home', conditions: { position: null, minutesSinceMedication: null, painNrs: null }, notes: null }, [
      { patientId: patient.id, takenAt: '2025-03-02T10:00:00.000Z', measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: ordinalValue('mas', '2') },
    ]);
    const readByB = (await b.assessments.get(saved.assessment.id))!;
    await setAssessmentDeleted(a, saved.assessment.id, true, { expectedUpdatedAt: saved.assessment.updatedAt });
    await setAssessmentDeleted(a, saved.assessment.id, false);
    await expect(setAssessmentDeleted(b, saved.assessment.id, true, { expectedUpdatedAt: readByB.updatedAt })).rejects.toMatchObject({ code: 'VersionConflict' });
    expect((await a.assessments.get(saved.assessment.id))!.deleted).toBe(false);
    expect((await a.observations.byPatient(patient.id)).every((o) => !o.deleted)).toBe(true);
  });
});
