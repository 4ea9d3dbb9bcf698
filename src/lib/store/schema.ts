import type { Dexie, Transaction } from 'dexie';
import { doseFromLegacyLine, type ExerciseDose } from '../domain';

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

/**
 * Version 6: home-programme items gain a structured `dose`. A dosage line that Kinnote itself wrote
 * before ("hold 30 s · 3 repetitions · 2 times a day") is read into the dose; any other text
 * ("3 × 30 s each side") gets no dose. In both cases the old text stays in `dosage`, untouched,
 * until the therapist saves a structured dose: no dosage is invented by the upgrade. No index
 * changes. (Version numbers 3–5 and 7 belong to other branches; the integrator renumbers.)
 */
async function upgradeToV6(tx: Transaction): Promise<void> {
  await tx
    .table('homeProgrammes')
    .toCollection()
    .modify((p: { items: { name: string; dosage: string; dose?: ExerciseDose | null }[] }) => {
      p.items = p.items.map((item) => ({ ...item, dose: item.dose ?? doseFromLegacyLine(item.dosage) }));
    });
}

export const SCHEMA_VERSIONS: readonly SchemaVersion[] = [
  { version: 1, stores: V1_STORES, summary: 'first release: one table per record kind, meta and audit' },
  {
    version: 2,
    stores: {
      ...V1_STORES,
      observations: 'id, patientId, assessmentId, measureCode, updatedAt, [patientId+measureCode+takenAt]',
      audit: 'id, recordId, table, createdAt, [table+recordId]',
    },
    upgrade: upgradeToV2,
    summary: 'observations.takenAt backfilled from the assessment; index [patientId+measureCode+takenAt]; audit [table+recordId]',
  },
  {
    version: 6,
    stores: {
      ...V1_STORES,
      observations: 'id, patientId, assessmentId, measureCode, updatedAt, [patientId+measureCode+takenAt]',
      audit: 'id, recordId, table, createdAt, [table+recordId]',
    },
    upgrade: upgradeToV6,
    summary: 'homeProgrammes.items[].dose: structured dose read from Kinnote-written dosage lines, free text kept as written',
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
