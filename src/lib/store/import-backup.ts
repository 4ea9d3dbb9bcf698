import { TABLE_NAMES, withoutByteOrderMark, type AuditEntry, type RecordBase, type TableName } from '../domain';
import { toPortable, verifyBundle, type BundleHeader, type VerifiedBundle } from './backup-bundle';
import { canonicalJson } from './canonical-json';
import { settleCaseloadSummaries } from './caseload-summaries';
import { checkReferences, type OutsideLookup } from './check-references';
import { decryptBundleText, isEncryptedBundle } from './encrypted-bundle';
import { planPhotoImport, writePhotoImport, type PhotoMode } from './import-photos';
import { EXERCISE_PHOTOS_TABLE } from './exercise-photos';
import type { KinnoteStore } from './open-store';
import { tableRows } from './table-rows';
import { SEALED_MARKER, auditSnapshot } from './rows';
import { auditEntry, nextTimestamp, requireActor } from './store-context';
import { StoreError, toStoreError } from './store-error';

export interface TableCounts {
  inserted: number;
  replaced: number;
  unchanged: number;
  keptLocal: number;
}

/** One record present on both sides with different content, and how it was settled. */
export interface MergeConflict {
  readonly table: TableName;
  readonly recordId: string;
  readonly localUpdatedAt: string;
  readonly incomingUpdatedAt: string;
  readonly winner: 'incoming' | 'local';
  /** 'newer': the winner's updatedAt is later; 'tie-break': same updatedAt, the larger canonical text wins (same on every device). */
  readonly reason: 'newer' | 'tie-break';
  /** True when an earlier import already recorded this very conflict (nothing new written). */
  readonly alreadyRecorded: boolean;
}

/** What an import did, for the user and the audit log. */
export interface MergeReport {
  readonly header: BundleHeader;
  readonly checksum: string;
  /** False when the bundle held nothing new (importing the same bundle twice). */
  readonly changed: boolean;
  readonly counts: Record<TableName, TableCounts>;
  readonly conflicts: readonly MergeConflict[];
  /** Exercise photos written and removed (photos are no records: they have no counts above). */
  readonly photos: { readonly written: number; readonly removed: number };
}

export interface ReadBackupOptions {
  readonly passphrase?: string;
  /** The reading device's clock (ms since 1970); default the system clock. Stamps later than this plus 10 minutes are refused. */
  readonly now?: () => number;
  /** Where references that the bundle does not resolve may point (the store imported into); none: the bundle must be self-contained. */
  readonly outside?: OutsideLookup;
  /** Patient ids the caller vouches for although their record is absent (a phone's own patient). */
  readonly knownPatientIds?: readonly string[];
}

/**
 * Parses (and, for an encrypted backup, decrypts) backup text or an already parsed value, and
 * verifies it completely (verifyBundle, then checkReferences). A leading UTF-8 byte-order mark is
 * ignored, as browsers do when they read a file as text. Writes nothing.
 */
export async function readBackup(input: string | unknown, options: ReadBackupOptions = {}): Promise<VerifiedBundle> {
  let parsed: unknown = input;
  let text: string | undefined;
  if (typeof input === 'string') parsed = parseJson((text = withoutByteOrderMark(input)), 'backup');
  if (isEncryptedBundle(parsed)) {
    if (options.passphrase === undefined) throw new StoreError('WrongPassphrase', 'this backup is encrypted: enter its passphrase');
    text = await decryptBundleText(parsed, options.passphrase);
    parsed = parseJson(text, 'decrypted backup');
  }
  const bundle = await verifyBundle(parsed, (options.now ?? Date.now)(), text);
  await checkReferences(bundle.tables, options.outside ?? null, { patientIds: options.knownPatientIds ?? [] });
  return bundle;
}

function parseJson(text: string, what: string): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch (cause) {
    throw new StoreError('InvalidBundle', `${what} is not complete JSON (truncated or damaged): ${(cause as Error).message}`, { cause });
  }
}

interface Planned {
  readonly table: TableName;
  readonly id: string;
  /** updatedAt of the local row when planned (undefined: absent), re-checked inside the write transaction. */
  readonly localUpdatedAt: string | undefined;
  readonly row: unknown;
}

/**
 * Imports a backup: verifies everything first (a bad bundle changes nothing), then merges by id in
 * one transaction. Absent records are inserted; identical ones left alone; when both sides differ
 * the newer updatedAt wins (equal times: the larger canonical text, so every device settles alike),
 * and each such conflict gets an audit entry (before = local, after = incoming) and a line in the
 * report. Audit entries from the bundle are only ever added, each marked `importedBy` this device.
 * References must resolve in the bundle or the store (`knownPatientIds`: patients vouched for by
 * the caller although absent). With protected content omitted from
 * the bundle, local names and notes are kept. A second import of the same bundle writes nothing.
 * Throws StoreError (InvalidBundle, TamperedBundle, UnsupportedBundle, WrongPassphrase, Locked,
 * VersionConflict if the store changed during the import, QuotaExceeded, Aborted).
 */
export async function importBackup(
  store: KinnoteStore,
  input: string | unknown,
  options: {
    passphrase?: string;
    knownPatientIds?: readonly string[];
    /**
     * For a team server pull: by `table/id`, the updatedAt of the server's copy this device last knew
     * (its base). A local copy still at its base was not changed here since, so a newer incoming copy
     * replaces it as an ordinary edit, with no conflict; and an incoming copy this device wrote itself
     * that is older than the local one is its own past, kept out without a conflict.
     */
    syncBases?: ReadonlyMap<string, string>;
    photos?: PhotoMode;
  } = {},
): Promise<MergeReport> {
  const outside: OutsideLookup = async (table, ids) => {
    try {
      return new Set((await tableRows(store.db, table).present([...ids])).keys());
    } catch (error) {
      throw toStoreError(error, 'reading the store before import');
    }
  };
  const bundle = await readBackup(input, { ...options, now: store.context.now, outside });
  requireActor(store.context);
  const included = bundle.header.protectedContent === 'included';
  const codecs = store.context.codecs;

  // Read phase: current rows of every incoming id.
  const local = new Map<TableName, Map<string, RecordBase>>();
  try {
    await store.db.transaction('r', [...TABLE_NAMES], async () => {
      for (const table of TABLE_NAMES) local.set(table, await tableRows(store.db, table).present(bundle.tables[table].map((r) => r.id)));
    });
  } catch (error) {
    throw toStoreError(error, 'reading the store before import');
  }

  // Plan phase (no writes): decide, seal, collect conflicts. Sealing happens here because awaiting
  // Web Crypto inside an IndexedDB transaction would let it commit early.
  const counts = Object.fromEntries(TABLE_NAMES.map((t) => [t, { inserted: 0, replaced: 0, unchanged: 0, keptLocal: 0 }])) as Record<TableName, TableCounts>;
  const writes: Planned[] = [];
  const checks: Planned[] = [];
  const at = nextTimestamp(store.context);
  const importedBy = { deviceId: requireActor(store.context).deviceId, importedAt: at };
  const conflicts: MergeConflict[] = [];
  const conflictAudits: { conflict: MergeConflict; before: Record<string, unknown>; after: Record<string, unknown> }[] = [];
  for (const table of TABLE_NAMES) {
    const codec = codecs[table];
    const localRows = local.get(table)!;
    for (const record of bundle.tables[table] as RecordBase[]) {
      const current = localRows.get(record.id);
      if (!current) {
        // An audit entry from a file keeps the author it claims, marked as taken in by this device.
        const row = table === 'audit' ? { ...toPortable('audit', record), importedBy } : await codec.toRow(record as never);
        writes.push({ table, id: record.id, localUpdatedAt: undefined, row });
        counts[table].inserted++;
        continue;
      }
      const localRecord = included ? await codec.fromRow(current as never) : codec.redact(current as never);
      const localText = canonicalJson(toPortable(table, localRecord as object));
      const incomingText = canonicalJson(toPortable(table, record));
      if (localText === incomingText) {
        counts[table].unchanged++;
        continue;
      }
      const tie = record.updatedAt === current.updatedAt;
      const incomingWins = tie ? incomingText > localText : record.updatedAt > current.updatedAt;
      // Audit entries are append-only: a differing copy never replaces the local one.
      const winner: 'incoming' | 'local' = incomingWins && table !== 'audit' ? 'incoming' : 'local';
      const base = options.syncBases?.get(`${table}/${record.id}`);
      // (A local copy at its base is the server's own earlier copy: whatever replaced it there, even by
      // a tie-break, was settled and listed by the server.)
      const ordinary =
        options.syncBases !== undefined &&
        ((winner === 'incoming' && base === current.updatedAt) || (winner === 'local' && !tie && record.deviceId === current.deviceId && table !== 'audit'));
      if (ordinary) {
        // Same outcome as the rule above; only nobody's change was overwritten, so no conflict.
        if (winner === 'incoming') {
          writes.push({ table, id: record.id, localUpdatedAt: current.updatedAt, row: keepSealedWhenOmitted(await codec.toRow(record as never), current, codec.sealedFields, included) });
          counts[table].replaced++;
        } else counts[table].keptLocal++;
        continue;
      }
      let row: unknown = undefined;
      if (winner === 'incoming') row = keepSealedWhenOmitted(await codec.toRow(record as never), current, codec.sealedFields, included);
      const before = auditSnapshot(table, current);
      const after = snapshotInClear(table, record, codec.protectedFields, codec.sealedFields);
      const alreadyRecorded = winner === 'local' && (await keepLocalRecorded(store, table, record.id, current.updatedAt, record.updatedAt));
      const conflict: MergeConflict = {
        table,
        recordId: record.id,
        localUpdatedAt: current.updatedAt,
        incomingUpdatedAt: record.updatedAt,
        winner,
        reason: tie ? 'tie-break' : 'newer',
        alreadyRecorded,
      };
      conflicts.push(conflict);
      if (!alreadyRecorded) conflictAudits.push({ conflict, before, after });
      if (winner === 'incoming') {
        writes.push({ table, id: record.id, localUpdatedAt: current.updatedAt, row });
        counts[table].replaced++;
      } else {
        checks.push({ table, id: record.id, localUpdatedAt: current.updatedAt, row: undefined });
        counts[table].keptLocal++;
      }
    }
  }

  const programmeIds = (list: Planned[]) => new Set(list.filter((w) => w.table === 'homeProgrammes').map((w) => w.id));
  const photoPlan = await planPhotoImport(store, bundle, { written: programmeIds(writes), keptLocal: programmeIds(checks) }, options.photos ?? 'merge');
  const changed = writes.length > 0 || conflictAudits.length > 0 || photoPlan.written + photoPlan.removed > 0;
  const report: MergeReport = { header: bundle.header, checksum: bundle.checksum, changed, counts, conflicts, photos: { written: photoPlan.written, removed: photoPlan.removed } };
  if (!changed) return report;

  const audits: AuditEntry[] = conflictAudits.map(({ conflict, before, after }) =>
    auditEntry(
      store.context,
      at,
      conflict.winner === 'incoming' ? 'merge-take-incoming' : 'merge-keep-local',
      conflict.table,
      conflict.recordId,
      before,
      after,
      `import of backup ${bundle.checksum.slice(0, 12)} from ${bundle.header.exportedBy?.deviceId ?? 'unknown device'}: ${conflict.reason === 'newer' ? `the ${conflict.winner} copy is newer` : 'same updatedAt, settled by content order'}`,
    ),
  );
  audits.push(
    auditEntry(store.context, at, 'import', '*', null, null, { checksum: bundle.checksum, source: bundle.header.source, exportedAt: bundle.header.exportedAt, counts }, `import of backup ${bundle.checksum.slice(0, 12)}`),
  );

  try {
    await store.db.transaction('rw', [...TABLE_NAMES, EXERCISE_PHOTOS_TABLE], async (tx) => {
      // One bulkGet per table re-checks that nothing planned on changed since the read phase.
      const planned = [...writes, ...checks];
      for (const table of TABLE_NAMES) {
        const mine = planned.filter((w) => w.table === table);
        if (mine.length === 0) continue;
        const now = await tableRows(store.db, table).present(mine.map((w) => w.id));
        for (const w of mine) {
          if (now.get(w.id)?.updatedAt !== w.localUpdatedAt) {
            throw new StoreError('VersionConflict', `${table} ${w.id} changed during the import; nothing was imported, try again`);
          }
        }
      }
      for (const table of TABLE_NAMES) {
        const rows = writes.filter((w) => w.table === table).map((w) => w.row);
        for (let i = 0; i < rows.length; i += WRITE_CHUNK) await tableRows(store.db, table).put(rows.slice(i, i + WRITE_CHUNK) as RecordBase[]);
      }
      await store.db.table('audit').bulkAdd(audits);
      await writePhotoImport(store, photoPlan);
      await settleCaseloadSummaries(store.db, tx);
    });
  } catch (error) {
    throw toStoreError(error, 'importing the backup');
  }
  return report;
}

/**
 * Rows are put this many at a time, all in the one import transaction. Same outcome as one bulkPut;
 * it keeps the number of requests in flight bounded (fake-indexeddb, which the Node store runs on,
 * takes each request off the front of one queue array: a 100,000-request queue made that quadratic,
 * 12 s of a 28 s Node import in the profile).
 */
const WRITE_CHUNK = 5_000;

/** With protected content omitted from the bundle, the local sealed text stays as it was. */
function keepSealedWhenOmitted(row: unknown, current: RecordBase, sealedFields: readonly string[], included: boolean): unknown {
  if (included) return row;
  const kept: Record<string, unknown> = { ...(row as object) };
  for (const f of sealedFields) kept[f] = (current as unknown as Record<string, unknown>)[f];
  return kept;
}

async function keepLocalRecorded(store: KinnoteStore, table: TableName, recordId: string, localUpdatedAt: string, incomingUpdatedAt: string): Promise<boolean> {
  const entries = await store.audit.forRecord(table, recordId);
  return entries.some(
    (e) =>
      e.action === 'merge-keep-local' &&
      (e.before as { updatedAt?: unknown } | null)?.updatedAt === localUpdatedAt &&
      (e.after as { updatedAt?: unknown } | null)?.updatedAt === incomingUpdatedAt,
  );
}

/** Audit snapshot of a record in clear: protected fields become the sealed marker, as for a stored row. */
function snapshotInClear(table: TableName, record: RecordBase, protectedFields: readonly string[], sealedFields: readonly string[]): Record<string, unknown> {
  const copy: Record<string, unknown> = { ...record };
  let any = false;
  for (const f of protectedFields) {
    if (copy[f] !== null && copy[f] !== undefined) any = true;
    delete copy[f];
  }
  for (const f of sealedFields) copy[f] = any ? SEALED_MARKER : null;
  return auditSnapshot(table, copy as unknown as RecordBase);
}
