import { TABLE_NAMES, type RecordBase, type TableName } from '../domain';
import { settleCaseloadSummaries } from './caseload-summaries';
import { checkBundleRecord, emptyTables, type BundleTables, type VerifiedBundle } from './backup-bundle';
import type { OutsideLookup } from './check-references';
import type { PhotoImportPlan } from './import-photos';
import { planMerge } from './import-plan';
import { readLocalRows } from './import-read-local';
import { importAudits, writeMerge } from './import-write';
import type { KinnoteStore } from './open-store';
import { verifyBackupStream, type CheckedStream } from './restore-stream';
import { BackupCutter } from './restore-stream-cut';
import { nextTimestamp, requireActor } from './store-context';
import { StoreError, toStoreError } from './store-error';
import { tableRows } from './table-rows';

export interface RestoreProgress {
  readonly phase: 'checking' | 'writing' | 'undoing';
  /** Records checked or written so far, and in all (known once the file is checked). */
  readonly done: number;
  readonly total: number | null;
}

export interface RestoreStreamOptions {
  readonly signal?: AbortSignal;
  readonly onProgress?: (progress: RestoreProgress) => void | Promise<void>;
  /** Records per write transaction (default 2,000). */
  readonly pageSize?: number;
}

/** One page's undo: the ids it inserted and the stored rows it replaced, by table. */
interface UndoPage {
  readonly inserted: Partial<Record<TableName, string[]>>;
  readonly replaced: Partial<Record<TableName, RecordBase[]>>;
}

const NO_PHOTOS: PhotoImportPlan = { replace: new Set(), rows: [], written: 0, removed: 0 };

/** Meta keys of the restore journal: the start, then one entry per page written. */
export const RESTORE_JOURNAL = 'restoreJournal';
const pageKey = (n: number) => `${RESTORE_JOURNAL}:${String(n).padStart(6, '0')}`;

/**
 * A streamed restore (merge by the import's rules) of a backup read in pieces from `open` (called
 * twice: once to check, once to write; a File's stream gives the same text each time):
 * pass 1 checks the whole file keeping ids (verifyBackupStream); pass 2 reads it again and writes
 * pages of `pageSize` records through the import's own steps (readLocalRows, planMerge, importAudits,
 * writeMerge), one transaction per page. Before each page, an entry in `meta` names what the page will
 * insert and the stored rows it will replace, so cancel, a failure, or a crash found on the next open
 * (recoverInterruptedRestore) undoes the written pages back to the records as they were.
 * Photos are not restored by this path yet (DEVELOPERS.md).
 */
export async function restoreBackupStream(store: KinnoteStore, open: () => AsyncIterable<string>, options: RestoreStreamOptions = {}): Promise<CheckedStream> {
  await recoverInterruptedRestore(store);
  const outside: OutsideLookup = async (table, ids) => new Set((await tableRows(store.db, table).present([...ids])).keys());
  const checked = await verifyBackupStream(open(), {
    now: store.context.now,
    outside,
    signal: options.signal,
    onProgress: (p) => options.onProgress?.({ phase: 'checking', done: p.records, total: null }),
  });
  const pageSize = options.pageSize ?? 2_000;
  await putMeta(store, RESTORE_JOURNAL, { checksum: checked.checksum, startedAt: new Date(store.context.now()).toISOString() });
  let pageNo = 0;
  let done = 0;
  try {
    let page = emptyTables();
    let inPage = 0;
    const flush = async () => {
      if (inPage === 0) return;
      if (options.signal?.aborted) throw new StoreError('Aborted', 'restore cancelled');
      await writePage(store, checked, page, pageNo++);
      done += inPage;
      page = emptyTables();
      inPage = 0;
      await options.onProgress?.({ phase: 'writing', done, total: checked.records });
    };
    const cutter = new BackupCutter();
    const nowMs = store.context.now();
    const scope = checked.header.scope;
    const omitted = checked.header.protectedContent === 'omitted';
    for await (const chunk of open()) {
      for (const piece of cutter.push(chunk)) {
        if (piece.kind === 'header') continue;
        const table = piece.table as TableName;
        const issues: { record: string; path: string; message: string }[] = [];
        const record = checkBundleRecord(table, JSON.parse(piece.text) as unknown, piece.index, { nowMs, scope, omitted }, issues);
        if (record === null || issues.length > 0 || checked.ids.get(table)![piece.index] !== record.id) {
          throw new StoreError('InvalidBundle', 'the file changed between checking and writing; the restore was undone');
        }
        (page[table] as unknown[]).push(record);
        if (++inPage >= pageSize) await flush();
      }
    }
    if (cutter.finish() !== checked.checksum) throw new StoreError('TamperedBundle', 'the file changed between checking and writing; the restore was undone');
    await flush();
  } catch (error) {
    await options.onProgress?.({ phase: 'undoing', done, total: checked.records });
    await undoJournal(store);
    throw error;
  }
  await clearJournal(store);
  return checked;
}

/** Plans one page with the import's steps, journals its undo, then writes it in one transaction. */
async function writePage(store: KinnoteStore, checked: CheckedStream, tables: BundleTables, n: number): Promise<void> {
  const bundle: VerifiedBundle = { header: checked.header, checksum: checked.checksum, tables, photos: null };
  const local = await readLocalRows(store, tables);
  const at = nextTimestamp(store.context);
  const plan = await planMerge(store, bundle, local, { deviceId: requireActor(store.context).deviceId, importedAt: at }, undefined);
  const audits = importAudits(store, bundle, plan, at, plan.counts);
  const undo: UndoPage = { inserted: { audit: audits.map((a) => a.id) }, replaced: {} };
  for (const w of plan.writes) {
    if (w.localUpdatedAt === undefined) (undo.inserted[w.table] ??= []).push(w.id);
    else (undo.replaced[w.table] ??= []).push(local.get(w.table)!.get(w.id)!);
  }
  await putMeta(store, pageKey(n), undo);
  await writeMerge(store, plan, audits, NO_PHOTOS);
}

/**
 * Undoes a restore that did not finish (cancelled, failed, or cut off by a crash or a closed tab):
 * every journalled page, last first, in one transaction; then the journal goes. Nothing to do when
 * there is no journal. Idempotent: a page journalled but never written removes ids that are absent
 * and puts back rows that are already there.
 */
export async function recoverInterruptedRestore(store: KinnoteStore): Promise<boolean> {
  try {
    if ((await store.db.table('meta').get(RESTORE_JOURNAL)) === undefined) return false;
  } catch (error) {
    throw toStoreError(error, 'reading the restore journal');
  }
  await undoJournal(store);
  return true;
}

async function undoJournal(store: KinnoteStore): Promise<void> {
  try {
    await store.db.transaction('rw', [...TABLE_NAMES, 'meta'], async (tx) => {
      const pages = (await store.db.table('meta').where('key').startsWith(`${RESTORE_JOURNAL}:`).toArray()) as { key: string; value: UndoPage }[];
      for (const { value } of pages.reverse()) {
        for (const table of TABLE_NAMES) {
          await tableRows(store.db, table).remove(value.inserted[table] ?? []);
          await tableRows(store.db, table).put(value.replaced[table] ?? []);
        }
      }
      await settleCaseloadSummaries(store.db, tx);
    });
  } catch (error) {
    throw toStoreError(error, 'undoing the unfinished restore');
  }
  await clearJournal(store);
}

async function clearJournal(store: KinnoteStore): Promise<void> {
  try {
    await store.db.transaction('rw', 'meta', async () => {
      await store.db.table('meta').where('key').startsWith(RESTORE_JOURNAL).delete();
    });
  } catch (error) {
    throw toStoreError(error, 'clearing the restore journal');
  }
}

async function putMeta(store: KinnoteStore, key: string, value: unknown): Promise<void> {
  try {
    await store.db.table('meta').put({ key, value });
  } catch (error) {
    throw toStoreError(error, 'writing the restore journal');
  }
}

/** A file's text in pieces as it is read (UTF-8; a character split between pieces is decoded whole). */
export async function* blobTextChunks(blob: Blob): AsyncIterable<string> {
  const reader = blob.stream().pipeThrough(new TextDecoderStream()).getReader();
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) return;
      yield value;
    }
  } finally {
    reader.releaseLock();
  }
}
