// Store checks that run inside Chromium, on real IndexedDB and Web Crypto. Bundled by
// test/e2e/bundle-for-page.ts and driven by test/e2e/store.e2e.ts and the Chromium bench.
import Dexie from 'dexie';
import { ordinalValue, validateRecord } from '../../../src/lib/domain';
import { canonicalJson, exportBackupText, importBackup, openStore, StoreError, type KinnoteStore } from '../../../src/lib/store';
import { declareSchema } from '../../../src/lib/store/schema';
import { sha256Hex } from '../../../src/lib/store/crypto-box';
import { auditSnapshot } from '../../../src/lib/store/rows';
import { tableRows } from '../../../src/lib/store/table-rows';
import { settleCaseloadSummaries } from '../../../src/lib/store/caseload-summaries';
import { adoptedLocalMdc, caseloadSummary } from '../../../src/lib/stats';

const ids = (n: number) => `0190a0b0-0000-7000-8000-${String(n).padStart(12, '0')}`;
const stamps = { createdAt: '2025-01-01T10:00:00.000Z', updatedAt: '2025-01-01T10:00:00.000Z', deviceId: ids(900), clinicianId: ids(901), deleted: false };

async function freshStore(name: string, kdfIterations = 1000): Promise<KinnoteStore> {
  await Dexie.delete(name);
  const store = await openStore({ name, kdfIterations, idleTimeoutMs: null });
  await store.ensureActor({ deviceName: 'Chromium', platform: 'test', clinicianName: 'In-page Tester', profession: 'physiotherapist' });
  await store.vault.setup('correct horse battery staple');
  return store;
}

async function seed(store: KinnoteStore, observations: number, batch = 5000): Promise<{ patientId: string; assessmentId: string }> {
  const patient = await store.patients.create({ code: 'K7QM-3XHD', birthYear: 1966, condition: 'stroke', affectedSides: ['left'], status: 'active' });
  const assessment = await store.assessments.create({
    patientId: patient.id,
    assessorId: store.actor!.clinicianId,
    performedAt: '2025-03-01T10:00:00.000Z',
    setting: 'home',
    conditions: { position: 'sitting', minutesSinceMedication: null, painNrs: null },
    notes: 'Invented note for the browser check',
  });
  await addObservations(store, { patientId: patient.id, assessmentId: assessment.id }, observations, batch);
  return { patientId: patient.id, assessmentId: assessment.id };
}

async function addObservations(store: KinnoteStore, where: { patientId: string; assessmentId: string }, observations: number, batch: number): Promise<void> {
  const grades = ['0', '1', '1+', '2', '3', '4'];
  const inputs = Array.from({ length: observations }, (_, i) => ({
    patientId: where.patientId,
    assessmentId: where.assessmentId,
    takenAt: '2025-03-01T10:00:00.000Z',
    measureCode: 'mas',
    siteCode: 'elbow-flexors',
    side: 'left' as const,
    mode: null,
    instrument: null,
    value: ordinalValue('mas', grades[i % 6] as string),
    traceId: null,
  }));
  for (let i = 0; i < inputs.length; i += batch) await store.observations.createMany(inputs.slice(i, i + batch));
}

/**
 * Counts of every table, and the audit count, for before/after comparisons. Observations are counted
 * as records, not as stored values (schema 16 packs several per value).
 */
async function counts(store: KinnoteStore): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const table of store.db.tables) out[table.name] = table.name === 'observations' ? (await tableRows(store.db, 'observations').all()).length : await table.count();
  return out;
}

export const storeChecks = {
  /** v1 database written by the first schema, then opened by the app's store: every record intact. */
  async migration() {
    const name = 'kinnote-browser-migration';
    await Dexie.delete(name);
    const old = new Dexie(name);
    declareSchema(old, 1);
    await old.open();
    const v1 = old.verno;
    await old.table('patients').add({ id: ids(1), ...stamps, code: 'K7QM-3XHD', birthYear: 1960, condition: 'stroke', affectedSides: ['left'], status: 'active' });
    await old.table('assessments').add({ id: ids(2), ...stamps, patientId: ids(1), assessorId: ids(901), performedAt: '2025-01-02T09:00:00.000Z', setting: 'clinic', conditions: { position: null, minutesSinceMedication: null, painNrs: null }, notesSealed: null });
    await old.table('observations').add({ id: ids(10), ...stamps, patientId: ids(1), assessmentId: ids(2), measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: { kind: 'ordinal', grade: '2', rank: 3 }, traceId: null });
    await old.table('traces').add({ id: ids(60), ...stamps, patientId: ids(1), assessmentId: ids(2), kind: 'pendulum-knee-angle', startedAt: stamps.createdAt, sampleRateHz: 100, channels: [{ name: 'knee', unit: 'deg', samples: new Float64Array([1, 2, 3]) }] });
    old.close();
    const store = await openStore({ name, kdfIterations: 1000, idleTimeoutMs: null });
    const series = await store.observations.series(ids(1), 'mas');
    const trace = await store.traces.get(ids(60));
    const result = {
      from: v1,
      to: store.db.verno,
      patientCode: (await store.patients.get(ids(1)))?.code,
      takenAt: series.map((o) => o.takenAt),
      traceSamples: Array.from(trace?.channels[0]?.samples ?? []),
      traceIsFloat64: trace?.channels[0]?.samples instanceof Float64Array,
    };
    store.close();
    await Dexie.delete(name);
    return result;
  },

  /**
   * A real QuotaExceededError: the test lowers this origin's quota (DevTools protocol), then a bulk
   * write larger than the quota must fail as StoreError QuotaExceeded and leave every table as it was.
   */
  async quota(observations: number) {
    const store = await freshStore('kinnote-browser-quota');
    const where = await seed(store, 10);
    const patientId = where.patientId;
    const before = await counts(store);
    let code: string | null = null;
    let message = '';
    try {
      // One bulk write (one transaction) far larger than the quota.
      await addObservations(store, where, observations, observations);
    } catch (error) {
      code = error instanceof StoreError ? error.code : `not a StoreError: ${String(error)}`;
      message = (error as Error).message;
    }
    const after = await counts(store);
    const series = await store.observations.series(patientId, 'mas');
    store.close();
    return { code, message, before, after, firstPatientObservations: series.length };
  },

  /** Encrypted backup: round trip into a second store; a tampered and a truncated file are refused whole. */
  async encryptedBackup() {
    const source = await freshStore('kinnote-browser-backup-a');
    await seed(source, 20);
    const text = await exportBackupText(source, { protectedContent: 'include', passphrase: 'backup passphrase 42', iterations: 1000 });
    const target = await freshStore('kinnote-browser-backup-b');
    const empty = await counts(target);
    const attempt = async (input: string, passphrase: string) => {
      try {
        await importBackup(target, input, { passphrase });
        return 'imported';
      } catch (error) {
        return error instanceof StoreError ? error.code : String(error);
      }
    };
    const parsed = JSON.parse(text) as Record<string, unknown>;
    const cipherKey = Object.keys(parsed).find((k) => typeof parsed[k] === 'string' && (parsed[k] as string).length > 200) as string;
    const cipher = parsed[cipherKey] as string;
    // One base64 character of the ciphertext changed.
    const flipped = { ...parsed, [cipherKey]: cipher.slice(0, 40) + (cipher[40] === 'A' ? 'B' : 'A') + cipher.slice(41) };
    const results = {
      wrongPassphrase: await attempt(text, 'not the passphrase'),
      tampered: await attempt(JSON.stringify(flipped), 'backup passphrase 42'),
      truncated: await attempt(text.slice(0, Math.floor(text.length * 0.7)), 'backup passphrase 42'),
      afterRefusals: await counts(target),
      empty,
      first: await attempt(text, 'backup passphrase 42'),
      afterFirst: await counts(target),
      second: await attempt(text, 'backup passphrase 42'),
      afterSecond: await counts(target),
      notesReadable: '',
    };
    const [assessment] = await target.assessments.list();
    results.notesReadable = assessment ? ((await target.assessments.open(assessment)).notes ?? '') : '';
    source.close();
    target.close();
    return results;
  },

  /** Bulk insert rate: `total` observations, validated, stamped and audited, in batches of 5,000. */
  async bulkInsert(total: number) {
    const store = await freshStore('kinnote-browser-bench');
    const start = performance.now();
    await seed(store, total);
    const seconds = (performance.now() - start) / 1000;
    const stored = (await tableRows(store.db, 'observations').all()).length;
    store.close();
    await Dexie.delete('kinnote-browser-bench');
    return { total, stored, seconds, perSecond: total / seconds };
  },

  /**
   * The bulk path's work before any write: validation, stamping (ids), sealing and the batch audit
   * entry (canonical JSON and SHA-256), in batches of 5,000, nothing stored. Where the time goes.
   */
  async prepareOnly(total: number) {
    const store = await freshStore('kinnote-browser-bench-prepare');
    const patient = await store.patients.create({ code: 'K7QM-3XHD', birthYear: 1966, condition: 'stroke', affectedSides: ['left'], status: 'active' });
    const grades = ['0', '1', '1+', '2', '3', '4'];
    const input = (i: number) => ({
      patientId: patient.id, assessmentId: patient.id, takenAt: '2025-03-01T10:00:00.000Z', measureCode: 'mas', siteCode: 'elbow-flexors',
      side: 'left' as const, mode: null, instrument: null, value: ordinalValue('mas', grades[i % 6] as string), traceId: null,
    });
    const start = performance.now();
    for (let done = 0; done < total; done += 5000) await store.observations.prepareCreate(Array.from({ length: Math.min(5000, total - done) }, (_, k) => input(done + k)));
    const seconds = (performance.now() - start) / 1000;
    store.close();
    await Dexie.delete('kinnote-browser-bench-prepare');
    return { total, stored: 0, seconds, perSecond: total / seconds };
  },
};

(globalThis as unknown as { storeChecks: typeof storeChecks }).storeChecks = storeChecks;

/**
 * Earlier bulk paths (for the bench's ratios, same run, same page). `schema` 2: the version-2
 * indexes and one audit entry with a full snapshot per record (before schema 5). `schema` 14: one
 * stored value per observation with the schema-5 indexes and one batch audit entry (ids and a
 * SHA-256 digest) per batch, as the repository wrote them before schema 16 packed observations.
 * Validation and stamping are the same calls the repository makes.
 */
export async function bulkInsertPrevious(total: number, batch = 5000, schema: 2 | 14 = 2): Promise<{ total: number; stored: number; seconds: number; perSecond: number }> {
  const name = `kinnote-browser-bench-previous-${schema}`;
  await Dexie.delete(name);
  const db = new Dexie(name);
  declareSchema(db, schema);
  await db.open();
  const uuid = () => {
    const b = crypto.getRandomValues(new Uint8Array(16));
    b[6] = 0x70 | (b[6]! & 0x0f);
    b[8] = 0x80 | (b[8]! & 0x3f);
    const h = Array.from(b, (x) => x.toString(16).padStart(2, '0')).join('');
    return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
  };
  const actor = { deviceId: uuid(), clinicianId: uuid() };
  const patientId = uuid();
  const assessmentId = uuid();
  const grades = ['0', '1', '1+', '2', '3', '4'];
  const start = performance.now();
  for (let done = 0; done < total; done += batch) {
    const at = new Date().toISOString();
    const rows: Record<string, unknown>[] = [];
    for (let i = done; i < Math.min(total, done + batch); i++) {
      const candidate = {
        patientId, assessmentId, takenAt: '2025-03-01T10:00:00.000Z', measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null,
        value: ordinalValue('mas', grades[i % 6] as string), traceId: null,
        id: uuid(), createdAt: at, updatedAt: at, ...actor, deleted: false,
      };
      const result = validateRecord('observations', candidate);
      if (!result.ok) throw new Error(JSON.stringify(result.issues));
      rows.push(result.record as unknown as Record<string, unknown>);
    }
    const audits =
      schema === 14
        ? [{
            id: uuid(), createdAt: at, updatedAt: at, ...actor, deleted: false, action: 'create', table: 'observations', recordId: null, before: null,
            after: { recordIds: rows.map((r) => r.id), count: rows.length, digest: { algorithm: 'SHA-256', over: 'canonical-json-of-audit-snapshots', value: await sha256Hex(canonicalJson(rows)) } },
            note: `batch of ${rows.length} observations`,
          }]
        : rows.map((row) => ({
            id: uuid(), createdAt: at, updatedAt: at, ...actor, deleted: false, action: 'create', table: 'observations', recordId: row.id, before: null,
            after: auditSnapshot('observations', row as never), note: null,
          }));
    await db.transaction('rw', ['observations', 'audit'], async () => {
      await db.table('observations').bulkAdd(rows);
      await db.table('audit').bulkAdd(audits);
    });
  }
  const seconds = (performance.now() - start) / 1000;
  const stored = await db.table('observations').count();
  db.close();
  await Dexie.delete(name);
  return { total, stored, seconds, perSecond: total / seconds };
}
(globalThis as unknown as { bulkInsertPrevious: typeof bulkInsertPrevious }).bulkInsertPrevious = bulkInsertPrevious;

/**
 * main's bulk path before the faster record preparation (8179a2f, schema 16), for the bench's ratio in the same run: the
 * same packed write, but records prepared as prepareCreate did then: a clock reading and a 10-byte
 * random draw per id, the schema's validation (valibot) per record, and the batch digest over
 * canonicalJson of the records. Same inputs and batches as storeChecks.bulkInsert.
 */
export async function bulkInsertMainPath(total: number, batch = 5000): Promise<{ total: number; stored: number; seconds: number; perSecond: number }> {
  const name = 'kinnote-browser-bench-main-path';
  const store = await freshStore(name);
  const start = performance.now();
  // As seed() does for the current path: a patient and an assessment, then the observations.
  const patient = await store.patients.create({ code: 'K7QM-3XHD', birthYear: 1966, condition: 'stroke', affectedSides: ['left'], status: 'active' });
  const assessment = await store.assessments.create({
    patientId: patient.id, assessorId: store.actor!.clinicianId, performedAt: '2025-03-01T10:00:00.000Z', setting: 'home',
    conditions: { position: 'sitting', minutesSinceMedication: null, painNrs: null }, notes: 'Invented note for the browser check',
  });
  const grades = ['0', '1', '1+', '2', '3', '4'];
  const ctx = store.context;
  const actor = store.actor!;
  for (let done = 0; done < total; done += batch) {
    const at = new Date(Math.floor(ctx.now())).toISOString();
    const rows: Record<string, unknown>[] = [];
    for (let i = done; i < Math.min(total, done + batch); i++) {
      const candidate = {
        patientId: patient.id, assessmentId: assessment.id, takenAt: '2025-03-01T10:00:00.000Z', measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null,
        value: ordinalValue('mas', grades[i % 6] as string), traceId: null,
        id: ctx.newId(), createdAt: at, updatedAt: at, deviceId: actor.deviceId, clinicianId: actor.clinicianId, deleted: false,
      };
      const result = validateRecord('observations', candidate);
      if (!result.ok) throw new Error(JSON.stringify(result.issues));
      rows.push(result.record as unknown as Record<string, unknown>);
    }
    const audit = {
      id: ctx.newId(), createdAt: at, updatedAt: at, ...actor, deleted: false, action: 'create', table: 'observations', recordId: null, before: null,
      after: { recordIds: rows.map((r) => r.id), count: rows.length, digest: { algorithm: 'SHA-256', over: 'canonical-json-of-audit-snapshots', value: await sha256Hex(canonicalJson(rows)) } },
      note: `batch of ${rows.length} observations`,
    };
    await store.db.transaction('rw', ['observations', 'audit'], async (tx) => {
      await tableRows(store.db, 'observations').add(rows as never);
      await store.db.table('audit').bulkAdd([audit]);
      await settleCaseloadSummaries(store.db, tx);
    });
  }
  const seconds = (performance.now() - start) / 1000;
  const stored = (await tableRows(store.db, 'observations').all()).length;
  store.close();
  await Dexie.delete(name);
  return { total, stored, seconds, perSecond: total / seconds };
}
(globalThis as unknown as { bulkInsertMainPath: typeof bulkInsertMainPath }).bulkInsertMainPath = bulkInsertMainPath;

/**
 * Fills the app's own database (already set up on this device) with `count` invented patients, each
 * with one assessment and two Modified Ashworth grades, for the large-caseload test.
 */
export async function fillCaseload(count: number): Promise<{ patients: number; seconds: number }> {
  const start = performance.now();
  const store = await openStore({ idleTimeoutMs: null });
  const alphabet = '23456789ABCDEFGHJKMNPQRSTVWXYZ';
  const code = (i: number) => {
    let s = '';
    let n = i + 30 ** 7;
    for (let k = 0; k < 8; k++) {
      s = alphabet[n % 30] + s;
      n = Math.floor(n / 30);
    }
    return `${s.slice(0, 4)}-${s.slice(4)}`;
  };
  for (let first = 0; first < count; first += 1000) {
    const patients = await store.patients.createMany(
      Array.from({ length: Math.min(1000, count - first) }, (_, j) => ({
        code: code(first + j),
        birthYear: 1940 + ((first + j) % 60),
        condition: 'stroke' as const,
        affectedSides: ['left' as const],
        status: 'active' as const,
      })),
    );
    const assessments = await store.assessments.createMany(
      patients.map((p, j) => ({
        patientId: p.id,
        assessorId: store.actor!.clinicianId,
        performedAt: new Date(Date.UTC(2026, 0, 1 + ((first + j) % 300), 10)).toISOString(),
        setting: 'home' as const,
        conditions: { position: null, minutesSinceMedication: null, painNrs: null },
        notes: null,
      })),
    );
    await store.observations.createMany(
      assessments.flatMap((a, j) =>
        ['elbow-flexors', 'knee-extensors'].map((siteCode) => ({
          patientId: a.patientId,
          assessmentId: a.id,
          takenAt: a.performedAt,
          measureCode: 'mas',
          siteCode,
          side: 'left' as const,
          mode: null,
          instrument: null,
          value: ordinalValue('mas', ['1', '1+', '2'][(first + j) % 3] as string),
          traceId: null,
        })),
      ),
    );
  }
  store.close();
  return { patients: count, seconds: (performance.now() - start) / 1000 };
}
(globalThis as unknown as { fillCaseload: typeof fillCaseload }).fillCaseload = fillCaseload;

/**
 * The ceiling of the storage layout, for the bench: `total` observation-shaped objects put with
 * plain IndexedDB (no Dexie, no index, no validation, no audit), `perRow` objects per stored value.
 * perRow 1 is today's layout (one row per observation); a larger perRow shows what packing
 * observations into blocks would allow.
 */
export async function rawPutCeiling(total: number, perRow: number): Promise<{ perSecond: number }> {
  const name = 'kinnote-browser-bench-raw';
  await Dexie.delete(name);
  const db: IDBDatabase = await new Promise((resolve, reject) => {
    const request = indexedDB.open(name, 1);
    request.onupgradeneeded = () => request.result.createObjectStore('rows', { keyPath: 'id' });
    request.onsuccess = () => resolve(request.result);
    request.onerror = () => reject(request.error);
  });
  const observation = (i: number) => ({
    id: ids(i), ...stamps, patientId: ids(1), assessmentId: ids(2), takenAt: '2025-03-01T10:00:00.000Z', measureCode: 'mas', siteCode: 'elbow-flexors',
    side: 'left', mode: null, instrument: null, value: { kind: 'ordinal', grade: '1+', rank: 2 }, traceId: null,
  });
  const values: { id: string; items: unknown[] }[] = [];
  for (let i = 0; i < total; i += perRow) values.push({ id: ids(i), items: Array.from({ length: Math.min(perRow, total - i) }, (_, k) => observation(i + k)) });
  const rowsPerTransaction = Math.max(1, Math.floor(5000 / perRow));
  const start = performance.now();
  for (let i = 0; i < values.length; i += rowsPerTransaction) {
    await new Promise<void>((resolve, reject) => {
      const tx = db.transaction('rows', 'readwrite');
      const store = tx.objectStore('rows');
      for (const value of values.slice(i, i + rowsPerTransaction)) store.add(perRow === 1 ? value.items[0] : value);
      tx.oncomplete = () => resolve();
      tx.onerror = () => reject(tx.error);
    });
  }
  const seconds = (performance.now() - start) / 1000;
  db.close();
  await Dexie.delete(name);
  return { perSecond: total / seconds };
}
(globalThis as unknown as { rawPutCeiling: typeof rawPutCeiling }).rawPutCeiling = rawPutCeiling;

/**
 * The caseload's data read, for the bench: the previous way (every patient, assessment and
 * observation read and grouped, then each patient's summary computed, as the page did before
 * schema 10) against the stored summaries (store.caseload()), in the same page and database.
 */
export async function caseloadReadTimes(): Promise<{ patients: number; observations: number; previousMs: number; storedMs: number; storedAgainMs: number; same: boolean }> {
  const store = await openStore({ idleTimeoutMs: null });
  const t0 = performance.now();
  const [patients, assessments, observations, studies] = await Promise.all([
    store.patients.list(),
    store.assessments.list(),
    store.observations.list(),
    store.reliabilityStudies.list(),
  ]);
  const localMdc = adoptedLocalMdc(studies);
  const group = <T extends { patientId: string }>(rows: T[]) => {
    const out = new Map<string, T[]>();
    for (const r of rows) out.set(r.patientId, [...(out.get(r.patientId) ?? []), r]);
    return out;
  };
  const assessmentsBy = group(assessments);
  const observationsBy = group(observations);
  const previous = patients.map((p) => ({ patientId: p.id, ...caseloadSummary(assessmentsBy.get(p.id) ?? [], observationsBy.get(p.id) ?? [], localMdc) }));
  const t1 = performance.now();
  const stored = await store.caseload();
  const t2 = performance.now();
  // Again: the first read may have found stale summaries to recompute (it says so by taking longer).
  await store.caseload();
  const t3 = performance.now();

  const strip = (rows: { patientId: string; lastAssessmentMs: number | null; improved: number; worsened: number }[]) =>
    JSON.stringify(rows.map((r) => [r.patientId, r.lastAssessmentMs, r.improved, r.worsened]).sort());
  store.close();
  return { patients: patients.length, observations: observations.length, previousMs: t1 - t0, storedMs: t2 - t1, storedAgainMs: t3 - t2, same: strip(previous) === strip(stored) };
}
(globalThis as unknown as { caseloadReadTimes: typeof caseloadReadTimes }).caseloadReadTimes = caseloadReadTimes;

/** The store code a bench import runs: the present one, or main's before the import's own speed-ups (test/bench/main-path.ts, loaded as `kinnoteMainImport`). */
interface ImportPath {
  readonly openStore: typeof openStore;
  readonly importBackup: (store: KinnoteStore, text: string) => Promise<unknown>;
}
const paths = (): Record<'present' | 'main', ImportPath | undefined> => ({
  present: { openStore, importBackup },
  main: (globalThis as unknown as { kinnoteMainImport?: ImportPath }).kinnoteMainImport,
});
let benchText: string | null = null;

/**
 * Backup import, for the bench, step 1: `total` observations written through the bulk path into one
 * store and exported as backup text, kept in the page for importBench.
 */
export async function importBenchFile(total: number): Promise<{ exportSeconds: number; bytes: number }> {
  const source = await freshStore('kinnote-browser-bench-import-a');
  await seed(source, total);
  const t0 = performance.now();
  benchText = await exportBackupText(source, { protectedContent: 'omit' });
  const t1 = performance.now();
  source.close();
  await Dexie.delete('kinnote-browser-bench-import-a');
  return { exportSeconds: (t1 - t0) / 1000, bytes: benchText.length };
}

/** Step 2: that file imported into an empty store by one path (parse, verify, merge, write). */
export async function importBench(which: 'present' | 'main'): Promise<{ stored: number; importSeconds: number }> {
  const path = paths()[which];
  if (!path || benchText === null) throw new Error(`no ${which} import path or no file: load kinnoteMainImport, run importBenchFile first`);
  const name = 'kinnote-browser-bench-import-b';
  await Dexie.delete(name);
  const target = await path.openStore({ name, kdfIterations: 1000, idleTimeoutMs: null });
  await target.ensureActor({ deviceName: 'Chromium', platform: 'test', clinicianName: 'In-page Tester', profession: 'physiotherapist' });
  await target.vault.setup('correct horse battery staple');
  const t0 = performance.now();
  await path.importBackup(target, benchText);
  const t1 = performance.now();
  const stored = await tableRows(target.db, 'observations').count();
  target.close();
  await Dexie.delete(name);
  return { stored, importSeconds: (t1 - t0) / 1000 };
}
(globalThis as unknown as { importBench: typeof importBench; importBenchFile: typeof importBenchFile }).importBench = importBench;
(globalThis as unknown as { importBenchFile: typeof importBenchFile }).importBenchFile = importBenchFile;
