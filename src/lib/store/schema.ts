import type { Dexie, Transaction } from 'dexie';
import { doseFromLegacyLine, type ExerciseDose, type Observation, type Patient } from '../domain';
import type { AdoptableStudy, SummaryAssessment } from '../stats';
import { CASELOAD_SUMMARIES_TABLE, allSummaryRows } from './caseload-summaries';
import { OBSERVATIONS_STORE, packObservations } from './observation-rows';
import { PHONE_REANALYSIS_MARKER } from './phone-reanalysis';

/**
 * Every schema version the app has shipped, oldest first. A version is never edited once released:
 * a change is a new entry with its own upgrade function and its own test (test/unit/store/migrations).
 * Index strings use Dexie's syntax: first the primary key, then indexes, `[a+b]` compound.
 */
export interface SchemaVersion {
  readonly version: number;
  readonly stores: Readonly<Record<string, string | null>>;
  readonly upgrade?: (tx: Transaction) => Promise<void>;
  /** What changed and why, for DEVELOPERS.md and the migration tests. */
  readonly summary: string;
}

const V1_STORES = {
  meta: 'key',
  clinicians: 'id, updatedAt',
  devices: 'id, updatedAt',
  patients: 'id, code, updatedAt',
  identities: 'id, patientId, updatedAt',
  events: 'id, patientId, [patientId+occurredOn], updatedAt',
  assessments: 'id, patientId, [patientId+performedAt], updatedAt',
  observations: 'id, patientId, assessmentId, measureCode, updatedAt',
  traces: 'id, patientId, assessmentId, updatedAt',
  homeProgrammes: 'id, patientId, updatedAt',
  adherenceEntries: 'id, patientId, programmeId, updatedAt',
  selfReports: 'id, patientId, [patientId+reportedOn], updatedAt',
  reliabilityStudies: 'id, measureCode, updatedAt',
  audit: 'id, recordId, table, createdAt',
} as const;

/**
 * Version 2: observations carry `takenAt` (their assessment's performedAt) and a compound index
 * [patientId+measureCode+takenAt], so a chart reads one patient's series of one measure in time
 * order from one index range, without joining assessments. The audit log gains [table+recordId] for
 * a record's history. Backfill: takenAt from the assessment; an observation whose assessment is
 * missing (never expected, but v1 did not forbid it) takes its own createdAt.
 */
async function upgradeToV2(tx: Transaction): Promise<void> {
  const performedAt = new Map<string, string>();
  await tx.table('assessments').each((a: { id: string; performedAt: string }) => {
    performedAt.set(a.id, a.performedAt);
  });
  await tx
    .table('observations')
    .toCollection()
    .modify((o: { assessmentId: string; createdAt: string; takenAt?: string }) => {
      o.takenAt = performedAt.get(o.assessmentId) ?? o.createdAt;
    });
}

const V2_STORES = {
  ...V1_STORES,
  observations: 'id, patientId, assessmentId, measureCode, updatedAt, [patientId+measureCode+takenAt]',
  audit: 'id, recordId, table, createdAt, [table+recordId]',
} as const;

/**
 * Version 4 (3 is assigned to another change and may be absent): a `drafts` table for unsaved form
 * content, one row per form, subject and tab (see drafts.ts), indexed by [form+subjectId]. The
 * upgrade leaves a marker in meta so that drafts kept in localStorage by earlier versions are moved
 * over once, after the open (an upgrade cannot read localStorage in a worker or in Node).
 */
async function upgradeToV4(tx: Transaction): Promise<void> {
  await tx.table('meta').put({ key: 'draftsFromLocalStorage', value: 'pending' });
}

/**
 * Version 5: indexes nothing reads are dropped, because every index costs a write per record
 * (measured on Chromium, DEVELOPERS.md store figures). Observations keep patientId (a patient's
 * records, a patient's backup), [patientId+measureCode+takenAt] (series) and updatedAt (the team
 * sync pushes records changed since its last mark); assessmentId and measureCode go. The audit log keeps createdAt (finds the batch entry of a record
 * created in bulk) and [table+recordId] (a record's history); recordId and table go. Records are
 * unchanged: IndexedDB drops the indexes itself, so the upgrade has nothing to rewrite.
 */
async function upgradeToV5(): Promise<void> {}

/**
 * Version 6: home-programme items gain a structured `dose`. A dosage line that Kinnote itself wrote
 * before ("hold 30 s · 3 repetitions · 2 times a day") is read into the dose; any other text
 * ("3 × 30 s each side") gets no dose. In both cases the old text stays in `dosage`, untouched,
 * until the therapist saves a structured dose: no dosage is invented by the upgrade. No index
 * changes.
 */
async function upgradeToV6(tx: Transaction): Promise<void> {
  await tx
    .table('homeProgrammes')
    .toCollection()
    .modify((p: { items: { name: string; dosage: string; dose?: ExerciseDose | null }[] }) => {
      p.items = p.items.map((item) => ({ ...item, dose: item.dose ?? doseFromLegacyLine(item.dosage) }));
    });
}

/**
 * Version 7 (issue 13): saved phone pendulum recordings are analysed again with the corrected code
 * (browsers' rotation-rate axis order, hand-held start). The upgrade only leaves a marker: the
 * analysis, the audited updates and the user's notice run after the open, one recording per
 * transaction (`runPendingPhoneReanalysis` in phone-reanalysis.ts says why not inside this
 * transaction). A database created at version 7 gets no marker (Dexie runs no upgrade on creation).
 * No index changes.
 */
async function upgradeToV7(tx: Transaction): Promise<void> {
  await tx.table('meta').put({ key: PHONE_REANALYSIS_MARKER, value: { doneTraceIds: [] } });
}

/**
 * Version 8: an `exercisePhotos` table for photos of home-programme exercises, indexed by
 * programmeId (see exercise-photos.ts for why they are kept apart from the HomeProgramme record).
 * No record changes, so nothing to rewrite.
 */
async function upgradeToV8(): Promise<void> {}

/**
 * Version 10 (9 was not used): a `caseloadSummaries` table, one row per patient keyed by
 * patientId and indexed by the caseload's default order (caseload-summaries.ts: kept up to date in the transaction of every write, so the caseload reads
 * one small row per patient and its first screen from the order index), built here for every patient.
 */
async function upgradeToV10(tx: Transaction): Promise<void> {
  const [patients, assessments, observations, studies] = await Promise.all([
    tx.table<Patient>('patients').toArray(),
    tx.table<SummaryAssessment>('assessments').toArray(),
    tx.table<Observation>('observations').toArray(),
    tx.table<AdoptableStudy>('reliabilityStudies').toArray(),
  ]);
  await tx.table(CASELOAD_SUMMARIES_TABLE).bulkPut(allSummaryRows(patients, assessments, observations, studies));
}

/**
 * Version 14 (11-13 are other branches'): a `teamBases` table, device-local like meta (never in a
 * backup): for each record this device has exchanged with its team server, the updatedAt of the
 * server's copy it last knew (team-sync.ts). A push sends it as the edit's base, so the server lists
 * a conflict only when someone else changed the record meanwhile; a pull replaces an unchanged local
 * copy without a conflict. Empty at first: a device already in a team starts from no bases (its
 * first push after the upgrade lists edits of teammates' records as conflicts once, as before).
 */
export const TEAM_BASES_TABLE = 'teamBases';
async function upgradeToV14(): Promise<void> {}

/**
 * Version 16 (15 unused; 17-19 are other branches'): observations packed into blocks of up to
 * BLOCK_SIZE (50), several to one stored value (observation-rows.ts says how they are found again),
 * because Chromium's IndexedDB pays per stored value and per index entry: one value per observation
 * capped bulk writes near 2,000 observations/s (DEVELOPERS.md, store figures). Indexes: the blocks'
 * patients (multi-entry) and their newest updatedAt; the per-observation indexes patientId, updatedAt
 * and [patientId+measureCode+takenAt] go. The upgrade reads every observation as stored by version
 * 2-14 (one value each), clears the store and writes them back packed in id order: every field of
 * every observation, tombstones included, is kept as it was (nothing is re-stamped or audited: the
 * records do not change, only where they sit).
 */
async function upgradeToV16(tx: Transaction): Promise<void> {
  const rows = (await tx.table(OBSERVATIONS_STORE).toArray()) as (Observation & { items?: unknown })[];
  const flat = rows.filter((r) => r.items === undefined).sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  if (flat.length === 0) return;
  // Written on the native store, below the caseload summaries' middleware: the observations do not
  // change, so neither do the summaries (through Dexie, the clear would drop every summary and the
  // re-add mark each patient stale for nothing). A failed request aborts the upgrade as a whole.
  const store = tx.idbtrans.objectStore(OBSERVATIONS_STORE);
  store.clear();
  let last: IDBRequest | null = null;
  for (const block of packObservations(flat)) last = store.add(block);
  await new Promise<void>((resolve, reject) => {
    last!.onsuccess = () => resolve();
    last!.onerror = () => reject(last!.error);
  });
}

export const SCHEMA_VERSIONS: readonly SchemaVersion[] = [
  { version: 1, stores: V1_STORES, summary: 'first release: one table per record kind, meta and audit' },
  {
    version: 2,
    stores: V2_STORES,
    upgrade: upgradeToV2,
    summary: 'observations.takenAt backfilled from the assessment; index [patientId+measureCode+takenAt]; audit [table+recordId]',
  },
  {
    version: 4,
    // Only the new table: Dexie keeps every table a version does not mention, so a version merged
    // in between (e.g. 3) keeps its own changes.
    stores: { drafts: 'id, [form+subjectId]' },
    upgrade: upgradeToV4,
    summary: 'drafts table (unsaved forms, one per form, subject and tab); localStorage drafts moved over once',
  },
  {
    version: 5,
    stores: {
      observations: 'id, patientId, updatedAt, [patientId+measureCode+takenAt]',
      audit: 'id, createdAt, [table+recordId]',
    },
    upgrade: upgradeToV5,
    summary: 'unused indexes dropped: observations assessmentId, measureCode; audit recordId, table',
  },
  {
    version: 6,
    // No index changes: only the table whose records the upgrade rewrites is named.
    stores: { homeProgrammes: V1_STORES.homeProgrammes },
    upgrade: upgradeToV6,
    summary: 'homeProgrammes.items[].dose: structured dose read from Kinnote-written dosage lines, free text kept as written',
  },
  {
    version: 7,
    // No index changes: only the table the upgrade writes is named.
    stores: { meta: V1_STORES.meta },
    upgrade: upgradeToV7,
    summary: 'saved phone pendulum recordings re-analysed after the open (corrected axis order, hand-held start); changes audited, refusals flagged, one notice',
  },
  {
    version: 8,
    stores: { exercisePhotos: 'id, programmeId' },
    upgrade: upgradeToV8,
    summary: 'exercisePhotos table (home-programme exercise photos, kept out of the audited programme record)',
  },
  {
    version: 10,
    stores: { [CASELOAD_SUMMARIES_TABLE]: 'patientId, order' },
    upgrade: upgradeToV10,
    summary: 'caseloadSummaries table (one row per patient, kept on write), built for every patient',
  },
  {
    version: 14,
    stores: { [TEAM_BASES_TABLE]: 'key' },
    upgrade: upgradeToV14,
    summary: 'teamBases table (device-local: the team server version each exchanged record was last known at)',
  },
  {
    version: 16,
    stores: { [OBSERVATIONS_STORE]: 'id, *patientIds, changedAt' },
    upgrade: upgradeToV16,
    summary: "observations packed into blocks (several per stored value, keyed by their lowest id); indexes: each block's patients and newest updatedAt",
  },
];

export const LATEST_SCHEMA_VERSION = SCHEMA_VERSIONS[SCHEMA_VERSIONS.length - 1]!.version;

/** Declares versions 1..`upTo` on a Dexie instance (tests declare an older set to build an old database). */
export function declareSchema(db: Dexie, upTo: number = LATEST_SCHEMA_VERSION): void {
  for (const v of SCHEMA_VERSIONS) {
    if (v.version > upTo) break;
    const declared = db.version(v.version).stores(v.stores as Record<string, string | null>);
    if (v.upgrade) declared.upgrade(v.upgrade);
  }
}
