import type { DBCore, DBCoreMutateRequest, DBCoreTable, DBCoreTransaction, Dexie, Transaction } from 'dexie';
import type { Observation, Patient } from '../domain';
import { adoptedLocalMdc, caseloadSummary, caseloadSummaryBasis, type AdoptableStudy, type CaseloadSummary, type SummaryAssessment } from '../stats';
import { ANY_RANGE, equalRange } from './core-ranges';
import { OBSERVATIONS_STORE, coreAllObservations, coreObservationsOfPatient, declaredObservationWrites, patientsOfStoredObservations } from './observation-rows';
import { toStoreError } from './store-error';

/**
 * Per-patient caseload summaries, kept up to date on write so that the caseload reads one small row
 * per patient instead of every assessment and observation (DEVELOPERS.md, "Caseload summaries").
 *
 * How they stay right:
 * - A Dexie middleware widens every read-write transaction that touches patients, assessments or
 *   observations to the summary table and the tables a summary is computed from, and for each
 *   write to those tables marks the patients concerned as stale, in that same transaction. A
 *   summary is therefore never newer or older than what it summarises without saying so.
 * - Each write path of the store (repositories, saveAssessment, importBackup) ends its transaction
 *   with settleCaseloadSummaries, which recomputes the patients it marked, still in that
 *   transaction: the write and its summaries commit together or not at all.
 * - The reader (readCaseloadSummaries) recomputes whatever it finds stale or made under other
 *   adopted MDCs (a write path that did not settle, a newly adopted reliability study, an upgrade),
 *   in one read-write transaction, and keeps the result.
 * Summaries are derived data: not records, not audited, never in backups.
 */
export const CASELOAD_SUMMARIES_TABLE = 'caseloadSummaries';

/** The patient fields the caseload shows and filters on (kept small: every field costs on each read). */
export type CaseloadPatient = Pick<Patient, 'id' | 'code' | 'status' | 'deleted'>;

/**
 * The caseload's default order as an index key: active patients first, by last assessment (so by
 * next due date: last + one review interval), never assessed after them, then by code; then paused,
 * discharged, tombstoned. Stale marks sort before everything (group -1), so reading the first rows
 * of this index always meets a stale mark if there is one. Codes are ASCII, so IndexedDB's
 * code-unit order is the caseload's code order.
 */
export type CaseloadOrder = readonly [group: number, lastAssessmentMs: number, code: string];
const GROUP_BY_STATUS: Readonly<Record<Patient['status'], number>> = { active: 0, paused: 1, discharged: 2 };
const TOMBSTONED_GROUP = 3;
const STALE_GROUP = -1;

function caseloadOrder(patient: CaseloadPatient, lastAssessmentMs: number | null): CaseloadOrder {
  return [patient.deleted ? TOMBSTONED_GROUP : GROUP_BY_STATUS[patient.status], lastAssessmentMs ?? Infinity, patient.code];
}

/** A stored summary, with what the caseload needs of the patient record, so it reads this one table. */
export interface CaseloadSummaryRow extends CaseloadSummary {
  readonly patientId: string;
  readonly patient: CaseloadPatient;
  /** caseloadSummaryBasis of the adopted MDCs it was computed with. */
  readonly basis: string;
  readonly order: CaseloadOrder;
}

/** A stale summary: to be recomputed before use. */
interface StaleMark {
  readonly patientId: string;
  readonly basis: null;
  readonly order: CaseloadOrder;
}
type StoredSummary = CaseloadSummaryRow | StaleMark;

/** Tables a summary is computed from; a write to one of them changes some patient's summary. */
const SOURCE_TABLES: ReadonlySet<string> = new Set(['patients', 'assessments', 'observations']);
/** Every table the upkeep reads or writes (adopted MDCs come from the reliability studies). */
export const CASELOAD_SUMMARY_SCOPE: readonly string[] = ['patients', 'assessments', 'observations', 'reliabilityStudies', CASELOAD_SUMMARIES_TABLE];


interface Keeper {
  down: DBCore | null;
  /** Patients marked stale in a transaction and not yet recomputed, per native transaction. */
  readonly pending: WeakMap<DBCoreTransaction, Set<string>>;
  /** Source rows written per native transaction (to leave bulk loads to the reader). */
  readonly written: WeakMap<DBCoreTransaction, number>;
}

/**
 * A transaction that wrote more source rows than this leaves its stale marks for the reader
 * instead of recomputing in the write: a bulk load of one patient's long series would otherwise
 * re-read and re-judge the whole series once per batch (measured: the Chromium bulk bench fell to
 * 0.79× the pre-schema-5 path). Interactive saves, merges of a few records and bulk creates of
 * patients or visits across many patients stay well below it.
 */
const SETTLE_MAX_ROWS = 2_000;
const keepers = new WeakMap<Dexie, Keeper>();

/** Installs the summary upkeep on a Dexie instance (before open). */
export function keepCaseloadSummaries(db: Dexie): void {
  const keeper: Keeper = { down: null, pending: new WeakMap(), written: new WeakMap() };
  keepers.set(db, keeper);
  db.use({
    stack: 'dbcore',
    name: 'caseloadSummaries',
    // Below Dexie's hooks and cache layers (levels 0 to 2), which read Dexie's transaction zone: this
    // layer awaits natively and passes the native transaction explicitly, as Dexie's own IndexedDB
    // layer does, so nothing under it needs the zone.
    level: -1,
    create(down) {
      keeper.down = down;
      return {
        ...down,
        transaction(stores, mode, options) {
          const widen = mode === 'readwrite' && stores.some((s) => SOURCE_TABLES.has(s)) && down.schema.tables.some((t) => t.name === CASELOAD_SUMMARIES_TABLE);
          return down.transaction(widen ? [...new Set([...stores, ...CASELOAD_SUMMARY_SCOPE])] : stores, mode, options);
        },
        table(name) {
          const table = down.table(name);
          if (!SOURCE_TABLES.has(name)) return table;
          return {
            ...table,
            async mutate(req) {
              if (!holdsSummaries(req.trans)) return table.mutate(req);
              // Observation blocks hold several patients: a write that declared what it brought marks those patients only.
              const brought = name === OBSERVATIONS_STORE && req.type !== 'deleteRange' ? declaredObservationWrites(req.trans) : undefined;
              const patientIds = brought ? [...brought.patients] : await patientsOf(name, table, req);
              const result = await table.mutate(req);
              // Declared observations are counted once, at settling (a split writes them in several mutations).
              if (!brought) keeper.written.set(req.trans, (keeper.written.get(req.trans) ?? 0) + (patientIds?.length ?? SETTLE_MAX_ROWS + 1));
              await markStale(keeper, down, req.trans, patientIds);
              return result;
            },
          };
        },
      };
    },
  });
}

/** False inside an upgrade that runs before the summary table exists (it is built by its own upgrade). */
function holdsSummaries(trans: DBCoreTransaction): boolean {
  const names = (trans as unknown as IDBTransaction).objectStoreNames;
  return !names || names.contains(CASELOAD_SUMMARIES_TABLE);
}

/** Patients whose summary a write changes; null: all of them (a range delete). */
async function patientsOf(table: string, core: DBCoreTable, req: DBCoreMutateRequest): Promise<string[] | null> {
  // A stored observation value holds several patients' observations (observation-rows.ts).
  const idsOf = (row: { id: string; patientId?: string } | undefined): string[] =>
    row === undefined ? [] : table === 'patients' ? [row.id] : table === OBSERVATIONS_STORE ? patientsOfStoredObservations(row) : typeof row.patientId === 'string' ? [row.patientId] : [];
  switch (req.type) {
    case 'add':
    case 'put':
      return req.values.flatMap((row) => idsOf(row as { id: string; patientId?: string }));
    case 'delete': {
      const rows = (await core.getMany({ trans: req.trans, keys: req.keys })) as ({ id: string; patientId?: string } | undefined)[];
      return table === 'patients' ? (req.keys as string[]) : rows.flatMap(idsOf);
    }
    default:
      return null;
  }
}

async function markStale(keeper: Keeper, down: DBCore, trans: DBCoreTransaction, patientIds: string[] | null): Promise<void> {
  const summaries = down.table(CASELOAD_SUMMARIES_TABLE);
  if (patientIds === null) {
    // A range delete (a table cleared): drop every summary; the reader rebuilds all of them.
    keeper.pending.delete(trans);
    await summaries.mutate({ type: 'deleteRange', trans, range: ANY_RANGE });
    return;
  }
  let pending = keeper.pending.get(trans);
  if (!pending) keeper.pending.set(trans, (pending = new Set()));
  const fresh: StaleMark[] = [];
  for (const id of patientIds) {
    if (pending.has(id)) continue;
    pending.add(id);
    fresh.push({ patientId: id, basis: null, order: [STALE_GROUP, 0, id] });
  }
  if (fresh.length > 0) await summaries.mutate({ type: 'put', trans, values: fresh });
}

/**
 * Recomputes the summaries of the patients written in this transaction, inside it. Call it last in
 * a read-write transaction that wrote patients, assessments or observations (`tx`: the transaction
 * the scope function received). Without it the summaries stay marked stale and the reader
 * recomputes them: slower, never wrong.
 */
export async function settleCaseloadSummaries(db: Dexie, tx: Transaction): Promise<void> {
  const keeper = keepers.get(db);
  const trans = tx.idbtrans as unknown as DBCoreTransaction;
  const pending = keeper?.pending.get(trans);
  if (!keeper?.down || !pending || pending.size === 0) return;
  keeper.pending.delete(trans);
  const written = (keeper.written.get(trans) ?? 0) + (declaredObservationWrites(trans)?.rows ?? 0);
  if (written > SETTLE_MAX_ROWS) return; // the marks stay: the reader recomputes
  await recompute(keeper.down, trans, pending);
}

async function readAll(down: DBCore, trans: DBCoreTransaction, table: string): Promise<unknown[]> {
  const core = down.table(table);
  return (await core.query({ trans, values: true, query: { index: core.schema.primaryKey, range: ANY_RANGE } })).result;
}

async function readByPatient(down: DBCore, trans: DBCoreTransaction, table: string, patientId: string): Promise<unknown[]> {
  const core = down.table(table);
  const index = core.schema.getIndexByKeyPath('patientId');
  if (!index) throw new Error(`${table} has no patientId index`);
  return (await core.query({ trans, values: true, query: { index, range: equalRange(patientId) } })).result;
}

function groupByPatient<T extends { patientId: string }>(rows: readonly T[]): Map<string, T[]> {
  const out = new Map<string, T[]>();
  for (const row of rows) {
    const list = out.get(row.patientId);
    if (list) list.push(row);
    else out.set(row.patientId, [row]);
  }
  return out;
}

/** Summary rows of the given patients from their records (pure; also used by the schema upgrade). */
export function summaryRows(
  patients: readonly Patient[],
  assessmentsByPatient: ReadonlyMap<string, readonly SummaryAssessment[]>,
  observationsByPatient: ReadonlyMap<string, readonly Observation[]>,
  studies: readonly AdoptableStudy[],
): CaseloadSummaryRow[] {
  const localMdc = adoptedLocalMdc(studies);
  const basis = caseloadSummaryBasis(localMdc);
  return patients.map((p) => {
    const patient: CaseloadPatient = { id: p.id, code: p.code, status: p.status, deleted: p.deleted };
    const summary = caseloadSummary(assessmentsByPatient.get(p.id) ?? [], observationsByPatient.get(p.id) ?? [], localMdc);
    return { patientId: p.id, patient, basis, order: caseloadOrder(patient, summary.lastAssessmentMs), ...summary };
  });
}

/** Builds every summary from whole tables (the schema upgrade, and the reader's full rebuild). */
export function allSummaryRows(patients: readonly Patient[], assessments: readonly SummaryAssessment[], observations: readonly Observation[], studies: readonly AdoptableStudy[]): CaseloadSummaryRow[] {
  return summaryRows(patients, groupByPatient(assessments), groupByPatient(observations), studies);
}

/**
 * Recomputes summaries inside a transaction at the DBCore level (the transaction's Dexie scope
 * need not name the summary table: the middleware widened the native one). 'all' rebuilds the
 * table. Many patients at once are read from whole tables, a few through the patientId index.
 */
async function recompute(down: DBCore, trans: DBCoreTransaction, which: ReadonlySet<string> | 'all'): Promise<void> {
  const summaries = down.table(CASELOAD_SUMMARIES_TABLE);
  const studies = (await readAll(down, trans, 'reliabilityStudies')) as AdoptableStudy[];
  const patientCount = await down.table('patients').count({ trans, query: { index: down.table('patients').schema.primaryKey, range: ANY_RANGE } });
  if (which === 'all' || which.size * 4 > patientCount) {
    const [patients, assessments, observations] = await Promise.all([
      readAll(down, trans, 'patients') as Promise<Patient[]>,
      readAll(down, trans, 'assessments') as Promise<SummaryAssessment[]>,
      coreAllObservations(down, trans),
    ]);
    const wanted = which === 'all' ? patients : patients.filter((p) => which.has(p.id));
    const rows = summaryRows(wanted, groupByPatient(assessments), groupByPatient(observations), studies);
    if (which === 'all') await summaries.mutate({ type: 'deleteRange', trans, range: ANY_RANGE });
    await write(summaries, trans, rows, which === 'all' ? [] : missing(which, rows));
    return;
  }
  const ids = [...which];
  const patients = ((await down.table('patients').getMany({ trans, keys: ids })) as (Patient | undefined)[]).filter((p): p is Patient => p !== undefined);
  const assessments = new Map<string, SummaryAssessment[]>();
  const observations = new Map<string, Observation[]>();
  await Promise.all(
    patients.flatMap((p) => [
      readByPatient(down, trans, 'assessments', p.id).then((rows) => void assessments.set(p.id, rows as SummaryAssessment[])),
      coreObservationsOfPatient(down, trans, p.id).then((rows) => void observations.set(p.id, rows)),
    ]),
  );
  const rows = summaryRows(patients, assessments, observations, studies);
  await write(summaries, trans, rows, missing(which, rows));
}

function missing(wanted: ReadonlySet<string>, rows: readonly CaseloadSummaryRow[]): string[] {
  const found = new Set(rows.map((r) => r.patientId));
  return [...wanted].filter((id) => !found.has(id));
}

async function write(summaries: DBCoreTable, trans: DBCoreTransaction, rows: CaseloadSummaryRow[], gone: string[]): Promise<void> {
  if (rows.length > 0) await summaries.mutate({ type: 'put', trans, values: rows });
  // A patient removed for good (never by the app: it keeps tombstones) loses its summary.
  if (gone.length > 0) await summaries.mutate({ type: 'delete', trans, keys: gone });
}

/**
 * Every live patient's caseload summary (tombstoned patients left out), in patient id order. Reads
 * the summary table (plus the reliability studies and the patient count, to know whether it is
 * current); whatever is stale, made under other adopted MDCs, or missing is recomputed and kept, in
 * one read-write transaction. Throws StoreError.
 */
export async function readCaseloadSummaries(db: Dexie): Promise<CaseloadSummaryRow[]> {
  const keeper = keepers.get(db);
  if (!keeper) throw new Error('caseload summaries are not kept on this database');
  const state = async () => {
    const [rows, studies, patientCount] = await Promise.all([
      db.table<StoredSummary>(CASELOAD_SUMMARIES_TABLE).toArray(),
      db.table<AdoptableStudy>('reliabilityStudies').toArray(),
      db.table('patients').count(),
    ]);
    const basis = caseloadSummaryBasis(adoptedLocalMdc(studies));
    const stale = new Set(rows.filter((r) => r.basis !== basis).map((r) => r.patientId));
    return { rows, stale, complete: rows.length === patientCount };
  };
  const live = (rows: StoredSummary[]) => rows.filter((r): r is CaseloadSummaryRow => r.basis !== null && !r.patient.deleted);
  try {
    const first = await db.transaction('r', [CASELOAD_SUMMARIES_TABLE, 'reliabilityStudies', 'patients'], state);
    if (first.complete && first.stale.size === 0) return live(first.rows);
    return await db.transaction('rw', [...CASELOAD_SUMMARY_SCOPE], async (tx) => {
      // Read again inside the write transaction: another tab may have written in between.
      const now = await state();
      if (!now.complete || now.stale.size > 0) {
        await recompute(keeper.down as DBCore, tx.idbtrans as unknown as DBCoreTransaction, now.complete ? now.stale : 'all');
      }
      return live(await db.table<StoredSummary>(CASELOAD_SUMMARIES_TABLE).toArray());
    });
  } catch (error) {
    throw toStoreError(error, 'reading the caseload');
  }
}

/**
 * The first `limit` rows of the caseload's default view (live active patients, soonest due first,
 * then never assessed, by code) from the summaries' order index: a read whose cost does not grow
 * with the caseload, so the first screen paints at once. Null when any summary is stale or was made
 * under other adopted MDCs (then only the full read, readCaseloadSummaries, is right). Throws StoreError.
 */
export async function readFirstCaseloadRows(db: Dexie, limit: number): Promise<CaseloadSummaryRow[] | null> {
  try {
    return await db.transaction('r', [CASELOAD_SUMMARIES_TABLE, 'reliabilityStudies'], async () => {
      const [rows, studies] = await Promise.all([
        db
          .table<StoredSummary>(CASELOAD_SUMMARIES_TABLE)
          .where('order')
          .between([STALE_GROUP, -Infinity, ''], [GROUP_BY_STATUS.active, Infinity, '\uffff'], true, true)
          .limit(limit)
          .toArray(),
        db.table<AdoptableStudy>('reliabilityStudies').toArray(),
      ]);
      const basis = caseloadSummaryBasis(adoptedLocalMdc(studies));
      return rows.every((r): r is CaseloadSummaryRow => r.basis === basis) ? rows : null;
    });
  } catch (error) {
    throw toStoreError(error, 'reading the caseload');
  }
}
