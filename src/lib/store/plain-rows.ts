import type { Table } from 'dexie';
import type { RecordBase } from '../domain';

/**
 * How the store reads and writes the rows of one record table, whatever their layout in IndexedDB.
 * Every write path (repositories, imports, the team sync, upgrades' follow-ups) goes through this
 * door, so a table whose rows are not stored one per IndexedDB value (observations: see
 * observation-rows.ts) changes here and nowhere else. Calls join the caller's Dexie transaction
 * when there is one, like Dexie's own table calls. Errors are Dexie's: callers map them
 * (toStoreError) with their own context.
 */
export interface TableRows<R extends RecordBase = RecordBase> {
  /** The row with this id, tombstoned or not. */
  get(id: string): Promise<R | undefined>;
  /** The rows of these ids that exist, by id. */
  present(ids: readonly string[]): Promise<Map<string, R>>;
  /** Every row, in id order. */
  all(): Promise<R[]>;
  /** How many rows (tombstones included). */
  count(): Promise<number>;
  /** Up to `limit` rows with an id after `after` (from the first when null), in id order: a table read in pages. */
  page(after: string | null, limit: number): Promise<R[]>;
  /** The rows of one patient (patient-scoped tables), in id order. */
  ofPatient(patientId: string): Promise<R[]>;
  /** Rows whose updatedAt (createdAt for the append-only audit log) is after `mark`, in no set order. */
  changedSince(mark: string): Promise<R[]>;
  countChangedSince(mark: string): Promise<number>;
  /** Adds new rows (fails, as a whole with the transaction, on an existing id). */
  add(rows: readonly R[]): Promise<void>;
  /** Writes rows, replacing those with the same id. */
  put(rows: readonly R[]): Promise<void>;
  /** Takes rows out for good (ids not stored are ignored): only for undoing an unfinished restore, never a deletion (deletions are tombstones). */
  remove(ids: readonly string[]): Promise<void>;
}

/** From this many ids, `present` first reads which ids exist from one key range (see presentIn). */
const PER_ID_READ_MAX = 256;

/**
 * Rows stored one per IndexedDB value, keyed by id: every table but observations. Also the observation
 * module's layout for now (observation-rows.ts).
 */
export function plainRows<R extends RecordBase>(t: Table<R, string>, changedField: 'updatedAt' | 'createdAt'): TableRows<R> {
  const changed = (mark: string) => {
    if (t.schema.idxByName[changedField] || t.schema.primKey.name === changedField) return t.where(changedField).above(mark);
    return t.filter((row) => ((row as unknown as Record<string, string>)[changedField] as string) > mark);
  };
  return {
    get: (id) => t.get(id),
    present: (ids) => presentIn(t, ids),
    all: () => t.toArray(),
    count: () => t.count(),
    page: (after, limit) => (after === null ? t.orderBy(':id') : t.where(':id').above(after)).limit(limit).toArray(),
    ofPatient: (patientId) => t.where('patientId').equals(patientId).sortBy('id'),
    changedSince: (mark) => changed(mark).toArray(),
    countChangedSince: (mark) => changed(mark).count(),
    add: async (rows) => {
      if (rows.length > 0) await t.bulkAdd([...rows]);
    },
    put: async (rows) => {
      if (rows.length > 0) await t.bulkPut([...rows]);
    },
    remove: async (ids) => {
      if (ids.length > 0) await t.bulkDelete([...ids]);
    },
  };
}

/**
 * The rows of `ids` that exist. Ids are UUIDv7 (time-ordered), so a large batch usually spans a
 * narrow key range: which ids exist comes from one key-range read of primary keys, and only those
 * rows are fetched (a `get` per absent id cost as much as the write itself on Chromium).
 */
async function presentIn<R extends RecordBase>(t: Table<R, string>, ids: readonly string[]): Promise<Map<string, R>> {
  let wanted: readonly string[] = ids;
  if (ids.length > PER_ID_READ_MAX) {
    let lowest = ids[0]!;
    let highest = ids[0]!;
    for (const id of ids) {
      if (id < lowest) lowest = id;
      if (id > highest) highest = id;
    }
    const keys = new Set((await t.where(':id').between(lowest, highest, true, true).primaryKeys()) as string[]);
    wanted = ids.filter((id) => keys.has(id));
  }
  const out = new Map<string, R>();
  if (wanted.length === 0) return out;
  for (const row of await t.bulkGet([...wanted])) if (row !== undefined) out.set(row.id, row);
  return out;
}
