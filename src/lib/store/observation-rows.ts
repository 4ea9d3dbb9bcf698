import Dexie, { type DBCore, type DBCoreTransaction } from 'dexie';
import type { Observation } from '../domain';
import { ANY_RANGE, equalRange } from './core-ranges';
import { plainRows, type TableRows } from './plain-rows';

/**
 * The one module that knows how observation rows sit in IndexedDB. Everything else reads and
 * writes observations through it: the repositories and imports through `tableRows` (table-rows.ts),
 * charts through `observationSeries`, the caseload summaries' middleware through the DBCore
 * readers below. Today one observation is one stored value in the `observations` object store
 * (schema 5 indexes: patientId, updatedAt, [patientId+measureCode+takenAt]); a layout that packs
 * several observations into one stored value changes this file, the schema and its upgrade only.
 *
 * Schema upgrades are the exception: each reads the layout of its own version, so they name the
 * object store themselves (schema.ts).
 */
export const OBSERVATIONS_STORE = 'observations';

export function observationRows(db: Dexie): TableRows<Observation> {
  return plainRows<Observation>(db.table<Observation, string>(OBSERVATIONS_STORE), 'updatedAt');
}

/**
 * One patient's observations of one measure in time order, tombstones included, from the compound
 * index [patientId+measureCode+takenAt] (one index range read, no join).
 */
export async function observationSeries(db: Dexie, patientId: string, measureCode: string): Promise<Observation[]> {
  return db
    .table<Observation, string>(OBSERVATIONS_STORE)
    .where('[patientId+measureCode+takenAt]')
    .between([patientId, measureCode, Dexie.minKey], [patientId, measureCode, Dexie.maxKey])
    .toArray();
}

/** Every observation, at the DBCore level inside `trans` (the caseload summaries' middleware). */
export async function coreAllObservations(down: DBCore, trans: DBCoreTransaction): Promise<Observation[]> {
  const core = down.table(OBSERVATIONS_STORE);
  return (await core.query({ trans, values: true, query: { index: core.schema.primaryKey, range: ANY_RANGE } })).result as Observation[];
}

/** One patient's observations, at the DBCore level inside `trans`. */
export async function coreObservationsOfPatient(down: DBCore, trans: DBCoreTransaction, patientId: string): Promise<Observation[]> {
  const core = down.table(OBSERVATIONS_STORE);
  const index = core.schema.getIndexByKeyPath('patientId');
  if (!index) throw new Error('observations have no patientId index');
  return (await core.query({ trans, values: true, query: { index, range: equalRange(patientId) } })).result as Observation[];
}
