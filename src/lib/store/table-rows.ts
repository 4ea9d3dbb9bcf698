import type { Dexie } from 'dexie';
import type { RecordBase, TableName } from '../domain';
import { observationRows } from './observation-rows';
import { plainRows, type TableRows } from './plain-rows';

export type { TableRows } from './plain-rows';

/** The rows of `table` in `db`. */
export function tableRows<R extends RecordBase = RecordBase>(db: Dexie, table: TableName): TableRows<R> {
  if (table === 'observations') return observationRows(db) as unknown as TableRows<R>;
  return plainRows<R>(db.table(table), table === 'audit' ? 'createdAt' : 'updatedAt');
}
