// Per-patient caseload summaries stay equal to a full recomputation from the records after every
// kind of write (create, update, delete, undo, a visit, an assessment tombstone, import, merge, a
// newly adopted MDC, a write around the repositories), and are settled in the write's own
// transaction (no stale mark left behind by the store's write paths).
import { describe, expect, it } from 'vitest';
import Dexie, { type DBCore, type DBCoreMutateRequest, type Middleware } from 'dexie';
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import { ordinalValue, type Observation, type Patient } from '../../../src/lib/domain';
import { adoptedLocalMdc, caseloadSummary, type AdoptableStudy, type SummaryAssessment } from '../../../src/lib/stats';
import { LATEST_SCHEMA_VERSION, importBackup, openStore, saveAssessment, setAssessmentDeleted, type KinnoteStore } from '../../../src/lib/store';
import { CASELOAD_SUMMARIES_TABLE } from '../../../src/lib/store/caseload-summaries';
import { declareSchema } from '../../../src/lib/store/schema';
import { exportBackup } from '../../../src/lib/store/export-backup';
import { caseloadRows, filterCaseload } from '../../../src/lib/ui/caseload-summary';
import { freshStore, quotaFault, steppingClock } from './store-helpers';
import { tableRows } from '../../../src/lib/store/table-rows';

/** The oracle: every live patient's summary computed from whole tables, grouped here, in patient id order. */
async function recomputed(store: KinnoteStore) {
  const [patients, assessments, observations, studies] = await Promise.all([
    store.db.table<Patient>('patients').toArray(),
    store.db.table<SummaryAssessment>('assessments').toArray(),
    tableRows<Observation>(store.db, 'observations').all(),
    store.db.table<AdoptableStudy>('reliabilityStudies').toArray(),
  ]);
  const localMdc = adoptedLocalMdc(studies);
  return patients
    .filter((p) => !p.deleted)
    .sort((a, b) => (a.id < b.id ? -1 : 1))
    .map((patient) => ({
      patient: { id: patient.id, code: patient.code, status: patient.status, deleted: patient.deleted },
      ...caseloadSummary(
        assessments.filter((a) => a.patientId === patient.id),
        observations.filter((o) => o.patientId === patient.id),
        localMdc,
      ),
    }));
}

/** What the caseload reads, without the bookkeeping fields. */
async function shown(store: KinnoteStore) {
  return (await store.caseload()).map(({ patientId: _id, basis: _basis, order: _order, ...rest }) => rest);
}

/** Raw stored rows: the store's own write paths leave none stale (basis null). */
async function staleRows(store: KinnoteStore): Promise<string[]> {
  const rows = await store.db.table<{ patientId: string; basis: string | null }>(CASELOAD_SUMMARIES_TABLE).toArray();
  return rows.filter((r) => r.basis === null).map((r) => r.patientId);
}

async function expectRight(store: KinnoteStore, step: string) {
  expect(await staleRows(store), `${step}: stale rows left by a write path`).toEqual([]);
  expect(await shown(store), step).toEqual(await recomputed(store));
}

const newPatient = (code: string) => ({ code, birthYear: 1961, condition: 'stroke' as const, affectedSides: ['left' as const], status: 'active' as const });
const conditions = { position: null, minutesSinceMedication: null, painNrs: null };
const mas = (grade: string) => ({ measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left' as const, mode: null, instrument: null, value: ordinalValue('mas', grade), traceIndex: null });

async function visit(store: KinnoteStore, patientId: string, performedAt: string, grade: string) {
  return saveAssessment(store, { patientId, assessorId: store.actor!.clinicianId, performedAt, setting: 'clinic', conditions, notes: null }, [{ ...mas(grade), patientId, takenAt: performedAt }]);
}

describe('caseload summaries', () => {
  it('follow create, visits, update, tombstones and undo, each settled in its own transaction', async () => {
    const store = await freshStore();
    const p = await store.patients.create(newPatient('K7QM-3XHD'));
    await expectRight(store, 'patient created');
    expect(await shown(store)).toEqual([{ patient: { id: p.id, code: 'K7QM-3XHD', status: 'active', deleted: false }, lastAssessmentMs: null, improved: 0, worsened: 0, changedTitles: [] }]);

    await visit(store, p.id, '2025-01-10T10:00:00.000Z', '3');
    const second = await visit(store, p.id, '2025-02-10T10:00:00.000Z', '1');
    await expectRight(store, 'two visits');
    // MAS 3 → 1 is three grade steps (3, 2, 1+, 1), beyond the one-step rule for ordinal grades
    // (DEVELOPERS.md: chooseMdc, common practice): one series improved.
    const [row] = await shown(store);
    expect(row).toMatchObject({ lastAssessmentMs: Date.parse('2025-02-10T10:00:00.000Z'), improved: 1, worsened: 0 });

    const obs = second.observations[0]!;
    await store.observations.update(obs.id, { value: ordinalValue('mas', '4') });
    await expectRight(store, 'observation updated');
    expect((await shown(store))[0]).toMatchObject({ improved: 0, worsened: 1 });

    await store.observations.remove(obs.id);
    await expectRight(store, 'observation tombstoned');
    expect((await shown(store))[0]).toMatchObject({ improved: 0, worsened: 0 });
    await store.observations.restore(obs.id);
    await expectRight(store, 'observation restored');

    await setAssessmentDeleted(store, second.assessment.id, true);
    await expectRight(store, 'assessment tombstoned');
    expect((await shown(store))[0]).toMatchObject({ lastAssessmentMs: Date.parse('2025-01-10T10:00:00.000Z'), worsened: 0 });
    await setAssessmentDeleted(store, second.assessment.id, false);
    await expectRight(store, 'assessment restored');

    await store.patients.update(p.id, { status: 'paused' });
    await expectRight(store, 'status changed');
    expect((await shown(store))[0]!.patient.status).toBe('paused');
    await store.patients.remove(p.id);
    await expectRight(store, 'patient tombstoned');
    expect(await shown(store)).toEqual([]);
    store.close();
  });

  it('follow a bulk create across many patients, and a failed write changes no summary', async () => {
    const fault = quotaFault(2);
    const store = await freshStore({ middleware: [fault] });
    const letters = 'ABCDEFGHJKMNPQRSTVWXYZ';
    const patients = await store.patients.createMany(Array.from({ length: 120 }, (_, i) => newPatient(`K7QM-${letters[i % 22]}${letters[Math.floor(i / 22)]}HD`)));
    const assessments = await store.assessments.createMany(
      patients.map((p, i) => ({ patientId: p.id, assessorId: store.actor!.clinicianId, performedAt: `2025-01-${String(1 + (i % 28)).padStart(2, '0')}T10:00:00.000Z`, setting: 'home' as const, conditions, notes: null })),
    );
    const observation = (grade: string) => {
      const { traceIndex: _none, ...rest } = mas(grade);
      return rest;
    };
    await store.observations.createMany(assessments.map((a, i) => ({ ...observation(['0', '1', '2'][i % 3]!), patientId: a.patientId, assessmentId: a.id, takenAt: a.performedAt, traceId: null })));
    await expectRight(store, '120 patients in bulk');

    // The first screen read from the order index is the head of the full caseload's default view.
    await store.patients.update(patients[5]!.id, { status: 'paused' });
    await store.patients.remove(patients[6]!.id);
    await store.patients.createMany([newPatient('K7QM-ZZZZ'), newPatient('K7QM-2222')]);
    const defaultView = filterCaseload(caseloadRows(await store.caseload()), '', 'all', Date.UTC(2025, 5, 1), new Map(), 'active');
    const head = (await store.caseloadFirstRows(40))!;
    expect(head.map((r) => r.patient.code)).toEqual(defaultView.slice(0, 40).map((r) => r.patient.code));
    expect(defaultView.map((r) => r.patient.code)).not.toContain(patients[5]!.code);
    const tail = (await store.caseloadFirstRows(500))!;
    expect(tail.map((r) => r.patient.code)).toEqual(defaultView.map((r) => r.patient.code));
    // Never assessed, after the assessed ones, by code.
    expect(tail.slice(-2).map((r) => r.patient.code)).toEqual(['K7QM-2222', 'K7QM-ZZZZ']);
    // A stale summary (a write around the repositories) makes the quick read refuse rather than guess.
    await store.db.table('patients').put({ ...(await store.patients.get(patients[0]!.id)), status: 'discharged' });
    expect(await store.caseloadFirstRows(40)).toBeNull();
    await store.caseload();
    expect((await store.caseloadFirstRows(500))!.map((r) => r.patient.code)).not.toContain(patients[0]!.code);

    const before = await store.db.table(CASELOAD_SUMMARIES_TABLE).toArray();
    fault.armed = true;
    await expect(visit(store, patients[0]!.id, '2025-03-01T10:00:00.000Z', '4')).rejects.toMatchObject({ code: 'QuotaExceeded' });
    fault.armed = false;
    expect(await store.db.table(CASELOAD_SUMMARIES_TABLE).toArray()).toEqual(before);
    store.close();
  });

  it('follow an import into an empty store and a merge where the newer copy wins', async () => {
    const a = await freshStore();
    const p = await a.patients.create(newPatient('K7QM-3XHD'));
    await visit(a, p.id, '2025-01-10T10:00:00.000Z', '2');
    const later = await visit(a, p.id, '2025-02-10T10:00:00.000Z', '2');
    const b = await freshStore({ now: steppingClock(Date.UTC(2025, 2, 1, 9, 5)) });
    await importBackup(b, await exportBackup(a, { protectedContent: 'include' }));
    await expectRight(b, 'imported');
    expect((await shown(b))[0]).toMatchObject({ improved: 0, worsened: 0 });

    // B worsens the grade later than A's copy; A then imports B's backup: B's newer copy wins.
    await b.observations.update(later.observations[0]!.id, { value: ordinalValue('mas', '4') });
    await expectRight(b, 'changed on B');
    const report = await importBackup(a, await exportBackup(b, { protectedContent: 'include' }));
    expect(report.conflicts.some((c) => c.table === 'observations' && c.winner === 'incoming')).toBe(true);
    await expectRight(a, 'merged into A');
    expect((await shown(a))[0]).toMatchObject({ worsened: 1 });
    a.close();
    b.close();
  });

  it('recompute only the patient of a saved visit, though its observations share blocks with others', async () => {
    // Counts the summaries each transaction writes (level -2: under the summaries' own layer at -1).
    const recomputedIn: string[][] = [];
    const counter: Middleware<DBCore> = {
      stack: 'dbcore',
      name: 'count-recomputed',
      level: -2,
      create: (down) => ({
        ...down,
        table(name) {
          const table = down.table(name);
          if (name !== CASELOAD_SUMMARIES_TABLE) return table;
          return {
            ...table,
            mutate(req: DBCoreMutateRequest) {
              if (req.type === 'put') recomputedIn.at(-1)?.push(...req.values.filter((r: { basis: string | null }) => r.basis !== null).map((r: { patientId: string }) => r.patientId));
              return table.mutate(req);
            },
          };
        },
      }),
    };
    const store = await freshStore({ middleware: [counter] });
    const patients = await store.patients.createMany(['K7QM-3XHD', 'K7QM-4XHD', 'K7QM-5XHD', 'K7QM-6XHD', 'K7QM-7XHD', 'K7QM-8XHD'].map(newPatient));
    // Eight visits each (six patients, 48 observations): one block of up to 50 holds them all, and the
    // saves below grow it past 50, so it splits.
    for (let round = 0; round < 8; round++) for (const p of patients) await visit(store, p.id, new Date(Date.UTC(2025, 0, 1 + round, 9)).toISOString(), ['1', '2'][round % 2]!);
    const blocks = await store.db.table<{ patientIds: string[] }>('observations').toArray();
    expect(blocks.some((b) => b.patientIds.length === patients.length)).toBe(true);
    await expectRight(store, 'eight visits each');

    for (const [i, p] of patients.slice(0, 3).entries()) {
      recomputedIn.push([]);
      await visit(store, p.id, `2025-02-0${1 + i}T10:00:00.000Z`, '3');
      expect(recomputedIn.at(-1), `visit ${i + 1}`).toEqual([p.id]);
    }
    expect((await store.db.table('observations').toArray()).length).toBeGreaterThan(1);
    await expectRight(store, 'three more visits, one block split');

    // Without an explicit transaction nothing says which observations came: every patient of the block is marked.
    const [one] = await store.observations.byPatient(patients[5]!.id);
    await tableRows<Observation>(store.db, 'observations').put([{ ...one!, value: ordinalValue('mas', '4') }]);
    expect((await staleRows(store)).length).toBeGreaterThan(1);
    expect(await shown(store)).toEqual(await recomputed(store));
    store.close();
  });

  it('follow an observation taken out of its block (the streamed restore\'s undo) in a transaction that also wrote another patient', async () => {
    const store = await freshStore();
    const p = await store.patients.create(newPatient('K7QM-5XHD'));
    const q = await store.patients.create(newPatient('K7QM-6XHD'));
    const first = await visit(store, p.id, '2025-01-10T10:00:00.000Z', '3');
    await visit(store, q.id, '2025-01-11T10:00:00.000Z', '3');
    const gone = await visit(store, q.id, '2025-02-11T10:00:00.000Z', '1');
    await expectRight(store, 'three visits');
    // One transaction: an edit of P's observation declares P; taking Q's later observation out must mark Q too.
    const rows = tableRows<Observation>(store.db, 'observations');
    await store.db.transaction('rw', ['observations'], async () => {
      await rows.put([{ ...first.observations[0]!, value: ordinalValue('mas', '2') }]);
      await rows.remove([gone.observations[0]!.id]);
    });
    expect(await shown(store)).toEqual(await recomputed(store));
    store.close();
  });

  it('are recomputed by the reader after a newly adopted MDC or a write around the repositories', async () => {
    const store = await freshStore();
    const p = await store.patients.create(newPatient('K7QM-3XHD'));
    await visit(store, p.id, '2025-01-10T10:00:00.000Z', '3');
    const second = await visit(store, p.id, '2025-02-10T10:00:00.000Z', '1');
    expect((await shown(store))[0]).toMatchObject({ improved: 1 });

    // The team adopts an MDC of 4 grade steps for this site: a three-step change is no longer beyond it.
    await store.reliabilityStudies.create({
      title: 'Elbow MAS study', measureCode: 'mas', siteCode: 'elbow-flexors', design: 'inter-rater', raterIds: [store.actor!.clinicianId],
      trials: [], notes: null, adoption: { mdc95: 4, sem: 1.1, iccForm: 'ICC(2,1)', adoptedAt: '2025-02-20T10:00:00.000Z' },
    });
    expect(await shown(store)).toEqual(await recomputed(store));
    expect((await shown(store))[0]).toMatchObject({ improved: 0 });

    // A write that bypasses the repositories is marked stale in its own transaction, then recomputed on read.
    const obs = await store.observations.get(second.observations[0]!.id);
    await store.db.transaction('rw', ['observations'], () => tableRows<Observation>(store.db, 'observations').put([{ ...obs!, value: ordinalValue('mas', '4') }]));
    expect(await staleRows(store)).toEqual([p.id]);
    expect(await shown(store)).toEqual(await recomputed(store));
    expect(await staleRows(store)).toEqual([]);
    // A hard delete (never done by the app) and a cleared table are followed too.
    await store.db.table('patients').delete(p.id);
    expect(await shown(store)).toEqual([]);
    await store.db.table(CASELOAD_SUMMARIES_TABLE).clear();
    await store.patients.create(newPatient('K7QM-4XHD'));
    expect(await shown(store)).toEqual(await recomputed(store));
    store.close();
  });

  it('leave a bulk load of one long series to the reader: marked stale in the write, right when read', async () => {
    const store = await freshStore();
    const p = await store.patients.create(newPatient('K7QM-3XHD'));
    const first = await visit(store, p.id, '2025-01-10T10:00:00.000Z', '3');
    const { traceIndex: _none, ...one } = mas('1');
    await store.observations.createMany(
      Array.from({ length: 2100 }, (_, i) => ({ ...one, patientId: p.id, assessmentId: first.assessment.id, takenAt: new Date(Date.UTC(2025, 1, 1) + i * 60_000).toISOString(), traceId: null })),
    );
    expect(await staleRows(store)).toEqual([p.id]);
    expect(await store.caseloadFirstRows(40)).toBeNull();
    expect(await shown(store)).toEqual(await recomputed(store));
    expect((await shown(store))[0]).toMatchObject({ improved: 1 });
    expect(await staleRows(store)).toEqual([]);
    store.close();
  });

  it('stay right through a seeded random mix of writes on a few patients', async () => {
    const store = await freshStore();
    let seed = 20261203;
    const random = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)]!;
    const patients = [await store.patients.create(newPatient('K7QM-2222')), await store.patients.create(newPatient('K7QM-3333')), await store.patients.create(newPatient('K7QM-4444'))];
    const grades = ['0', '1', '1+', '2', '3', '4'];
    for (let step = 0; step < 40; step++) {
      const p = pick(patients);
      const kind = pick(['visit', 'visit', 'update', 'remove', 'restore', 'tombstone-visit', 'status']);
      const observations = await store.observations.byPatient(p.id, { includeDeleted: true });
      const assessments = await store.assessments.byPatient(p.id, { includeDeleted: true });
      if (kind === 'visit' || observations.length === 0) {
        await visit(store, p.id, new Date(Date.UTC(2025, 0, 1 + step, 9 + Math.floor(random() * 8))).toISOString(), pick(grades));
      } else if (kind === 'update') {
        await store.observations.update(pick(observations).id, { value: ordinalValue('mas', pick(grades)) });
      } else if (kind === 'remove' || kind === 'restore') {
        const o = pick(observations);
        await (o.deleted ? store.observations.restore(o.id) : store.observations.remove(o.id));
      } else if (kind === 'tombstone-visit') {
        const a = pick(assessments);
        await setAssessmentDeleted(store, a.id, !a.deleted);
      } else {
        await store.patients.update(p.id, { status: pick(['active', 'paused', 'discharged'] as const) });
      }
      await expectRight(store, `step ${step}: ${kind}`);
    }
    store.close();
  });
});

describe('schema v10', () => {
  it('v6 → v10: summaries built for every patient, observations indexed by updatedAt again', async () => {
    const factory = new IDBFactory();
    const ids = (n: number) => `0190a0b0-0000-7000-8000-${String(n).padStart(12, '0')}`;
    const stamps = { createdAt: '2025-01-01T10:00:00.000Z', updatedAt: '2025-01-01T10:00:00.000Z', deviceId: ids(900), clinicianId: ids(901), deleted: false };
    const old = new Dexie('kinnote', { indexedDB: factory, IDBKeyRange });
    declareSchema(old, 6);
    await old.open();
    await old.table('patients').bulkAdd([
      { id: ids(1), ...stamps, code: 'K7QM-3XHD', birthYear: 1960, condition: 'stroke', affectedSides: ['left'], status: 'active' },
      { id: ids(2), ...stamps, code: 'K7QM-4XHD', birthYear: 1970, condition: 'stroke', affectedSides: ['right'], status: 'active' },
    ]);
    const assessment = (id: number, performedAt: string) => ({ id: ids(id), ...stamps, patientId: ids(1), assessorId: ids(901), performedAt, setting: 'clinic', conditions, notesSealed: null });
    await old.table('assessments').bulkAdd([assessment(10, '2025-01-02T09:00:00.000Z'), assessment(11, '2025-02-02T09:00:00.000Z')]);
    const observation = (id: number, assessmentId: number, takenAt: string, grade: string) => ({
      id: ids(id), ...stamps, patientId: ids(1), assessmentId: ids(assessmentId), takenAt, measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: ordinalValue('mas', grade), traceId: null,
    });
    await old.table('observations').bulkAdd([observation(20, 10, '2025-01-02T09:00:00.000Z', '1'), observation(21, 11, '2025-02-02T09:00:00.000Z', '3')]);
    old.close();

    const store = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    expect(store.db.verno).toBe(LATEST_SCHEMA_VERSION);
    expect(await store.db.table(CASELOAD_SUMMARIES_TABLE).count()).toBe(2);
    expect(await staleRows(store)).toEqual([]);
    expect(await shown(store)).toEqual(await recomputed(store));
    // MAS 1 → 3: three grade steps worse (one-step rule for ordinal grades, common practice).
    expect((await shown(store)).map((r) => [r.patient.code, r.lastAssessmentMs, r.worsened])).toEqual([
      ['K7QM-3XHD', Date.parse('2025-02-02T09:00:00.000Z'), 1],
      ['K7QM-4XHD', null, 0],
    ]);
    expect(await tableRows(store.db, 'observations').countChangedSince('2024-12-31')).toBe(2);
    store.close();
  });
});
