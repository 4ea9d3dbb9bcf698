import { EARLIEST_TIMESTAMP, MAX_CLOCK_SKEW_MS, TABLE_NAMES, type RecordBase, type TableName } from '../domain';
import { settleCaseloadSummaries } from './caseload-summaries';
import type { KinnoteStore } from './open-store';
import { auditEntry } from './store-context';
import { toStoreError } from './store-error';
import { tableRows } from './table-rows';

/**
 * The rows of `table` stamped after `mark` (updatedAt; for the append-only audit log, createdAt), read
 * through the store's layout of the table (table-rows.ts: an index where there is one).
 */
export function rowsChangedSince(store: Pick<KinnoteStore, 'db'>, table: TableName, mark: string): { toArray(): Promise<unknown[]>; count(): Promise<number> } {
  const rows = tableRows(store.db, table);
  return { toArray: () => rows.changedSince(mark), count: () => rows.countChangedSince(mark) };
}

/** Most records one audit entry lists (its snapshots stay far below MAX_AUDIT_SNAPSHOT_CHARS: ~130 characters a record). */
const RECORDS_PER_ENTRY = 1000;

export interface MovedStamp {
  readonly table: TableName;
  readonly id: string;
  readonly from: { readonly createdAt: string; readonly updatedAt: string };
  readonly to: { readonly createdAt: string; readonly updatedAt: string };
}

/**
 * Brings back onto the team's time line the records stamped further ahead of it than any reader
 * accepts (MAX_CLOCK_SKEW_MS), which a device makes while its clock runs fast before it has measured
 * its offset from the team server (in practice: records made before its first sync). Without this
 * the server refuses their push forever (each refusal stops the whole sync), so they would never
 * reach the team.
 *
 * Each such record's createdAt and updatedAt move by the store's offset (the server's clock minus
 * the device's, measured at the start of the sync), so they say when the record was made in team
 * time, and never past team now. Nothing else in the record changes: not its content, not its
 * writer, and not the clinical times the clinician recorded (an observation's takenAt, an
 * assessment's performedAt), which stay as the device's clock gave them. One audit entry (per 1,000
 * records) lists every record with its old and new stamps and the offset used, in the same
 * transaction as the change, so nothing moves silently. Call it with the store's clock already
 * corrected (store.clock.setOffset). Returns what moved.
 */
export async function moveStampsAheadOfTeamTime(store: KinnoteStore): Promise<MovedStamp[]> {
  const nowMs = Math.floor(store.context.now());
  const teamNow = new Date(nowMs).toISOString();
  const limit = new Date(nowMs + MAX_CLOCK_SKEW_MS).toISOString();
  const offsetMs = store.clock.offsetMs;
  const shift = (stamp: string, ceiling: string): string => {
    const moved = new Date(Date.parse(stamp) + Math.min(offsetMs, 0)).toISOString();
    const bounded = moved < ceiling ? moved : ceiling;
    return bounded < EARLIEST_TIMESTAMP ? EARLIEST_TIMESTAMP : bounded;
  };
  const moved: MovedStamp[] = [];
  try {
    // Almost every sync finds nothing ahead: a read-only look (an index range on the stamp) keeps it
    // from taking a read-write lock over every record table; the write re-reads inside its own.
    if (!(await anyStampBeyond(store, limit))) return moved;
    await store.db.transaction('rw', [...TABLE_NAMES], async (tx) => {
      for (const table of TABLE_NAMES) {
        const rows = (await rowsChangedSince(store, table, limit).toArray()) as RecordBase[];
        if (rows.length === 0) continue;
        const changed = rows.map((row) => {
          const updatedAt = shift(row.updatedAt, teamNow);
          const createdAt = shift(row.createdAt, updatedAt);
          moved.push({ table, id: row.id, from: { createdAt: row.createdAt, updatedAt: row.updatedAt }, to: { createdAt, updatedAt } });
          return { ...row, createdAt, updatedAt };
        });
        await tableRows(store.db, table).put(changed);
      }
      for (let i = 0; i < moved.length; i += RECORDS_PER_ENTRY) {
        const part = moved.slice(i, i + RECORDS_PER_ENTRY);
        const entry = auditEntry(
          store.context,
          teamNow,
          'update',
          '*',
          null,
          { stamps: part.map((m) => ({ table: m.table, id: m.id, ...m.from })) },
          { stamps: part.map((m) => ({ table: m.table, id: m.id, ...m.to })), offsetMs },
          `Record stamps moved onto the team server's clock: this device's clock was ${Math.round(-offsetMs / 60_000)} min ahead when ${part.length} record(s) were made. ` +
            'Content unchanged; clinical times (taken at, performed at) are as the device clock gave them.',
        );
        await store.db.table('audit').add(entry);
      }
      await settleCaseloadSummaries(store.db, tx);
    });
  } catch (error) {
    throw toStoreError(error, 'moving stamps onto the team clock');
  }
  return moved;
}

/** Whether any record table holds a row stamped after `limit`, read in one read-only transaction. */
async function anyStampBeyond(store: KinnoteStore, limit: string): Promise<boolean> {
  return store.db.transaction('r', [...TABLE_NAMES], async () => {
    for (const table of TABLE_NAMES) if ((await rowsChangedSince(store, table, limit).count()) > 0) return true;
    return false;
  });
}
