import type { Dexie } from 'dexie';
import type { RecordBase, TableName } from '../domain';
import { BLOCK_SIZE, OBSERVATIONS_STORE, observationRows } from './observation-rows';
import { plainRows, type TableRows } from './plain-rows';

export type { TableRows } from './plain-rows';

/** The rows of `table` in `db`. */
export function tableRows<R extends RecordBase = RecordBase>(db: Dexie, table: TableName): TableRows<R> {
  if (table === 'observations') return observationRows(db) as unknown as TableRows<R>;
  return plainRows<R>(db.table(table), table === 'audit' ? 'createdAt' : 'updatedAt');
}

/**
 * At least as many as `table` holds, without reading its values: the exact count for tables stored one
 * row per value, the blocks times BLOCK_SIZE for observations (a key count; exact when every block is
 * full, which appending writes keep nearly so). For a progress total that a reader corrects per table.
 */
export async function rowCountBound(db: Dexie, table: TableName): Promise<number> {
  if (table === 'observations') return (await db.table(OBSERVATIONS_STORE).count()) * BLOCK_SIZE;
  return db.table(table).count();
}
