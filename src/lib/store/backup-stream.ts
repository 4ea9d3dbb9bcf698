import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex } from '@noble/hashes/utils.js';
import { TABLE_NAMES, type TableName } from '../domain';
import { toPortable } from './backup-bundle';
import { sortPhotos, toPortablePhoto } from './backup-photos';
import { canonicalJson } from './canonical-json';
import { EXERCISE_PHOTOS_TABLE, type ExercisePhotoRow } from './exercise-photos';
import { backupHeader } from './export-backup';
import type { KinnoteStore } from './open-store';
import { StoreError, toStoreError } from './store-error';
import { rowCountBound, tableRows } from './table-rows';

export interface BackupProgress {
  /**
   * Records written so far, and in all. The total starts as a bound read from keys only (observations:
   * blocks × BLOCK_SIZE, not one read of every block) and is made exact as each table ends, so it ends
   * equal to `done`; it never falls below `done`.
   */
  readonly done: number;
  readonly total: number;
}

export interface StreamBackupOptions {
  readonly protectedContent: 'include' | 'omit';
  readonly source?: string;
  /** Called with each piece of the file after the checksum, in order (a browser keeps them as Blob parts). */
  readonly write: (piece: string) => void;
  /** Awaited before the next page (a worker can post it and a test can write in between). */
  readonly onProgress?: (progress: BackupProgress) => void | Promise<void>;
  /** Cancel: checked between pages; the store is only read, so nothing needs undoing. */
  readonly signal?: AbortSignal;
  /** Records read per read transaction (default 2,000). */
  readonly pageSize?: number;
}

/** The streamed file is `head`, every piece given to `write`, then `tail`. */
export interface StreamedBackup {
  readonly head: string;
  readonly tail: string;
  readonly checksum: string;
  readonly records: number;
}

/**
 * A whole-store backup written piece by piece, byte for byte the file exportBackupText writes (same
 * canonical JSON, same SHA-256 checksum), with memory bounded by one page of records. The format puts
 * the checksum first, so the body is hashed incrementally (@noble/hashes: WebCrypto has no
 * incremental digest) while its pieces go to `write`, and the checksum member is returned as `head`.
 *
 * Records are read in pages of `pageSize` by id (the order the bundle sorts them in), one read
 * transaction per page, because opening sealed names and notes awaits WebCrypto, which would end a
 * longer transaction. Consistency instead: every write to a backed-up table adds an audit entry
 * in its transaction and the audit log is append-only, so an audit count that moved between the
 * start and the end means the store changed during the backup: refused as VersionConflict (try
 * again) rather than a backup of two moments. Cancel throws Aborted.
 */
export async function streamBackup(store: KinnoteStore, options: StreamBackupOptions): Promise<StreamedBackup> {
  const include = options.protectedContent === 'include';
  if (include && store.vault.status !== 'unlocked') throw new StoreError('Locked', 'unlock the vault to export names and notes, or export without them');
  const pageSize = options.pageSize ?? 2_000;
  const hash = sha256.create();
  const encoder = new TextEncoder();
  const emit = (piece: string) => {
    hash.update(encoder.encode(piece));
    options.write(piece);
  };
  const stop = () => {
    if (options.signal?.aborted) throw new StoreError('Aborted', 'backup cancelled; the store was only read and is unchanged');
  };
  const { auditBefore, bounds, photos } = await startSnapshot(store);
  let total = [...bounds.values()].reduce((a, b) => a + b, 0);
  let reported = -1;
  const header = backupHeader(store, options.source ?? 'export', { kind: 'all' }, include);
  // Keys sorted: every header member and "photos" come before "tables".
  const headText = canonicalJson({ ...header, photos });
  hash.update(encoder.encode('{'));
  emit(`${headText.slice(1, -1)},"tables":{`);
  let done = 0;
  const tables = [...TABLE_NAMES].sort();
  for (const [t, table] of tables.entries()) {
    emit(`${t > 0 ? ',' : ''}${JSON.stringify(table)}:[`);
    let after: string | null = null;
    let first = true;
    const before = done;
    for (;;) {
      stop();
      const page = await readPage(store, table, after, pageSize, include);
      if (page.rows === 0) break;
      after = page.lastId;
      done += page.rows;
      if (done - before > bounds.get(table)!) throw new StoreError('VersionConflict', 'the store changed during the backup, so the file would mix two moments; try again');
      if (page.text !== '') {
        emit(`${first ? '' : ','}${page.text}`);
        first = false;
      }
      reported = total;
      await options.onProgress?.({ done, total });
    }
    total += done - before - bounds.get(table)!;
    emit(']');
  }
  emit('}}');
  if (total !== reported) await options.onProgress?.({ done, total });
  if ((await countAudit(store)) !== auditBefore) throw new StoreError('VersionConflict', 'the store changed during the backup, so the file would mix two moments; try again');
  const checksum = bytesToHex(hash.digest());
  return { head: `{"checksum":{"algorithm":"SHA-256","value":"${checksum}"},`, tail: '\n', checksum, records: done };
}

async function countAudit(store: KinnoteStore): Promise<number> {
  try {
    return await store.db.table('audit').count();
  } catch (error) {
    throw toStoreError(error, 'reading the store for backup');
  }
}

/** The audit count, a bound on each table's records (keys only), and the photos of live programmes (kept whole: they are size-capped). */
async function startSnapshot(store: KinnoteStore) {
  try {
    return await store.db.transaction('r', [...TABLE_NAMES, EXERCISE_PHOTOS_TABLE], async () => {
      const bounds = new Map<TableName, number>();
      for (const table of TABLE_NAMES) bounds.set(table, await rowCountBound(store.db, table));
      const live = new Set(((await store.db.table('homeProgrammes').toArray()) as { id: string; deleted: boolean }[]).filter((p) => !p.deleted).map((p) => p.id));
      const rows = await store.db.table<ExercisePhotoRow, string>(EXERCISE_PHOTOS_TABLE).toArray();
      const photos = sortPhotos(rows.filter((r) => live.has(r.programmeId)).map(({ id: _id, addedAtMs: _at, ...photo }) => photo)).map(toPortablePhoto);
      return { auditBefore: await store.db.table('audit').count(), bounds, photos };
    });
  } catch (error) {
    throw toStoreError(error, 'reading the store for backup');
  }
}

/**
 * One page of a table's records after `after` by id, as canonical JSON (records in bundle form, joined by commas). The one
 * place the streamed backup reads rows: records come out through the table's codec (open or redact),
 * as exportBackup reads them.
 */
async function readPage(store: KinnoteStore, table: TableName, after: string | null, limit: number, include: boolean) {
  let rows: unknown[];
  try {
    rows = await store.db.transaction('r', table, () => tableRows(store.db, table).page(after, limit));
  } catch (error) {
    throw toStoreError(error, 'reading the store for backup');
  }
  const codec = store.context.codecs[table];
  const records: Record<string, unknown>[] = [];
  for (const row of rows) {
    const record = include ? await codec.fromRow(row as never) : codec.redact(row as never);
    if (record !== null) records.push(toPortable(table, record as object));
  }
  // One serialisation per page (the array's text without its brackets is the records joined by
  // commas): per record it took three times as long.
  const text = records.length > 0 ? canonicalJson(records).slice(1, -1) : '';
  return { rows: rows.length, lastId: rows.length > 0 ? (rows[rows.length - 1] as { id: string }).id : after, text };
}
