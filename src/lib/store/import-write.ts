import { TABLE_NAMES, type AuditEntry, type RecordBase } from '../domain';
import type { VerifiedBundle } from './backup-bundle';
import { settleCaseloadSummaries } from './caseload-summaries';
import { EXERCISE_PHOTOS_TABLE } from './exercise-photos';
import { writePhotoImport, type PhotoImportPlan } from './import-photos';
import type { MergePlan } from './import-plan';
import type { Planned, TableCounts } from './import-types';
import type { KinnoteStore } from './open-store';
import { auditEntry } from './store-context';
import { tableRows } from './table-rows';
import { StoreError, toStoreError } from './store-error';

/** Import step 4a: one audit entry per newly recorded conflict, and one for the import itself. */
export function importAudits(store: KinnoteStore, bundle: VerifiedBundle, plan: MergePlan, at: string, counts: Record<string, TableCounts>): AuditEntry[] {
  const from = `import of backup ${bundle.checksum.slice(0, 12)}`;
  const audits: AuditEntry[] = plan.conflictAudits.map(({ conflict, before, after }) =>
    auditEntry(
      store.context,
      at,
      conflict.winner === 'incoming' ? 'merge-take-incoming' : 'merge-keep-local',
      conflict.table,
      conflict.recordId,
      before,
      after,
      `${from} from ${bundle.header.exportedBy?.deviceId ?? 'unknown device'}: ${conflict.reason === 'newer' ? `the ${conflict.winner} copy is newer` : 'same updatedAt, settled by content order'}`,
    ),
  );
  audits.push(auditEntry(store.context, at, 'import', '*', null, null, { checksum: bundle.checksum, source: bundle.header.source, exportedAt: bundle.header.exportedAt, counts }, from));
  return audits;
}

/**
 * Import step 4b (write), all in one transaction: re-checks that nothing planned on changed since
 * the read step (else VersionConflict, nothing written), writes the rows, adds the audits, writes
 * the photos and settles the caseload summaries. Rows planned as absent are added, not put: an add
 * refuses an id stored meanwhile, which is that re-check without reading the ids again (an import
 * into an empty store reads the store's ids once, in the read step).
 */
export async function writeMerge(store: KinnoteStore, plan: MergePlan, audits: AuditEntry[], photoPlan: PhotoImportPlan): Promise<void> {
  try {
    await store.db.transaction('rw', [...TABLE_NAMES, EXERCISE_PHOTOS_TABLE], async (tx) => {
      // One read per table re-checks the rows planned over a local copy.
      const planned = [...plan.writes, ...plan.checks].filter((w) => w.localUpdatedAt !== undefined);
      for (const table of TABLE_NAMES) {
        const mine = planned.filter((w) => w.table === table);
        if (mine.length === 0) continue;
        const now = await tableRows(store.db, table).present(mine.map((w) => w.id));
        for (const w of mine) if (now.get(w.id)?.updatedAt !== w.localUpdatedAt) throw changedDuringImport(table, w.id);
      }
      for (const table of TABLE_NAMES) {
        const rows = tableRows(store.db, table);
        const mine = plan.writes.filter((w) => w.table === table);
        await inChunks(mine.filter((w) => w.localUpdatedAt !== undefined), (chunk) => rows.put(chunk));
        await inChunks(mine.filter((w) => w.localUpdatedAt === undefined), async (chunk) => {
          try {
            await rows.add(chunk);
          } catch (error) {
            throw isIdTaken(error) ? changedDuringImport(table, 'a record') : error;
          }
        });
      }
      await store.db.table('audit').bulkAdd(audits);
      await writePhotoImport(store, photoPlan);
      await settleCaseloadSummaries(store.db, tx);
    });
  } catch (error) {
    throw toStoreError(error, 'importing the backup');
  }
}

function changedDuringImport(table: string, what: string): StoreError {
  return new StoreError('VersionConflict', `${table} ${what} changed during the import; nothing was imported, try again`);
}

/** An add refused because the id is stored already (IndexedDB's ConstraintError, alone or in Dexie's BulkError). */
function isIdTaken(error: unknown): boolean {
  const e = error as { name?: unknown; inner?: unknown; failures?: unknown };
  if (e?.name === 'ConstraintError') return true;
  if (Array.isArray(e?.failures)) return e.failures.length > 0 && e.failures.every((f) => isIdTaken(f));
  return e?.inner !== undefined && isIdTaken(e.inner);
}

/** Writes planned rows WRITE_CHUNK at a time, each chunk awaited before the next. */
async function inChunks(planned: readonly Planned[], write: (rows: RecordBase[]) => Promise<void>): Promise<void> {
  for (let i = 0; i < planned.length; i += WRITE_CHUNK) await write(planned.slice(i, i + WRITE_CHUNK).map((w) => w.row as RecordBase));
}

/**
 * Rows are put this many at a time, all in the one import transaction. Same outcome as one bulkPut;
 * it keeps the number of requests in flight bounded (fake-indexeddb, which the Node store runs on,
 * takes each request off the front of one queue array: a 100,000-request queue made that quadratic,
 * 12 s of a 28 s Node import in the profile).
 */
const WRITE_CHUNK = 5_000;
