import { TABLE_NAMES, type RecordBase, type TableName } from '../domain';
import type { BundleTables } from './backup-bundle';
import type { KinnoteStore } from './open-store';
import { toStoreError } from './store-error';
import { tableRows } from './table-rows';

/** Import step 2 (read): the current rows of every incoming id, by table, in one read transaction. */
export async function readLocalRows(store: KinnoteStore, tables: BundleTables): Promise<Map<TableName, Map<string, RecordBase>>> {
  const local = new Map<TableName, Map<string, RecordBase>>();
  try {
    await store.db.transaction('r', [...TABLE_NAMES], async () => {
      for (const table of TABLE_NAMES) local.set(table, await tableRows(store.db, table).present(tables[table].map((r) => r.id)));
    });
  } catch (error) {
    throw toStoreError(error, 'reading the store before import');
  }
  return local;
}
