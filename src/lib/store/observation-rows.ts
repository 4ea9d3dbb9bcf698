import Dexie, { type DBCore, type DBCoreTransaction, type Table } from 'dexie';
import type { Observation } from '../domain';
import { ANY_RANGE, equalRange } from './core-ranges';
import type { TableRows } from './plain-rows';

/**
 * The one module that knows how observation rows sit in IndexedDB. Everything else reads and
 * writes observations through it: the repositories and imports through `tableRows` (table-rows.ts),
 * charts through `observationSeries`, the caseload summaries' middleware through the DBCore
 * readers below. Schema upgrades are the exception: each reads the layout of its own version, so
 * they name the object store themselves (schema.ts).
 *
 * Layout (schema 16): observations are packed into blocks, several to one stored value, because
 * IndexedDB's cost is per stored value, not per byte (DEVELOPERS.md, store figures: one value per
 * observation capped bulk writes near 2,000 observations/s in Chromium). The blocks partition the
 * id space: a block's key (`id`) is the lowest observation id it holds, and it holds every
 * observation from its key up to the next block's key, sorted by id. Ids are UUIDv7 (time-ordered),
 * so new observations append to the last block and a visit's observations sit together.
 * - an observation by id: the block with the greatest key ≤ id (one reverse key-range read);
 * - a patient's observations: the multi-entry index `patientIds` (each patient once per block);
 * - changed since a mark (team sync): the index `changedAt` (the newest updatedAt in the block);
 * - a series: the patient's observations filtered and ordered by takenAt, then id (the order the
 *   former [patientId+measureCode+takenAt] index gave).
 * Writing one observation rewrites its block (at most BLOCK_SIZE observations). All or nothing
 * holds as before: every block of a write is put inside the caller's transaction.
 */
export const OBSERVATIONS_STORE = 'observations';

/**
 * Observations per block (measured: DEVELOPERS.md, store figures). A block of 50 is about 27 KB
 * (an observation is about 540 bytes as JSON). Larger blocks were slower in Chromium, not faster:
 * plain IndexedDB stored 80,678 observations/s at 50 per value but 16,528 at 200 per value (about
 * 108 KB) in the same run; Chromium keeps values above a size threshold (64 KB, from memory) in
 * separate blob files.
 */
export const BLOCK_SIZE = 50;

/** One stored value of the observations store. */
export interface ObservationBlock {
  /** The lowest observation id in the block: the primary key. */
  readonly id: string;
  /** The patients of the block's observations, each once (multi-entry index). */
  readonly patientIds: readonly string[];
  /** The newest updatedAt among the block's observations (index for the team sync). */
  readonly changedAt: string;
  /** The observations, sorted by id. */
  readonly items: readonly Observation[];
}

/**
 * The patient of each observation a stored value of this store holds, once per observation: the
 * caseload summaries' marks for a write that did not say which observations it brought (a write
 * outside a transaction; see declaredObservationWrites).
 */
export function patientsOfStoredObservations(value: unknown): string[] {
  const block = value as Partial<ObservationBlock> & { patientId?: unknown };
  if (Array.isArray(block.items)) return block.items.map((o) => o.patientId);
  return typeof block.patientId === 'string' ? [block.patientId] : [];
}

export function makeBlock(items: readonly Observation[]): ObservationBlock {
  let changedAt = '';
  const patients = new Set<string>();
  for (const o of items) {
    if (o.updatedAt > changedAt) changedAt = o.updatedAt;
    patients.add(o.patientId);
  }
  return { id: items[0]!.id, patientIds: [...patients], changedAt, items };
}

/** Observations sorted by id, cut into blocks of BLOCK_SIZE (the last may be smaller). */
export function packObservations(sorted: readonly Observation[]): ObservationBlock[] {
  const out: ObservationBlock[] = [];
  for (let i = 0; i < sorted.length; i += BLOCK_SIZE) out.push(makeBlock(sorted.slice(i, i + BLOCK_SIZE)));
  return out;
}

const byId = (a: { id: string }, b: { id: string }) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);

export function observationRows(db: Dexie): TableRows<Observation> {
  const t = db.table<ObservationBlock, string>(OBSERVATIONS_STORE);
  const flat = (blocks: readonly ObservationBlock[]) => blocks.flatMap((b) => b.items);
  const changed = (mark: string) => t.where('changedAt').above(mark).toArray().then((blocks) => flat(blocks).filter((o) => o.updatedAt > mark));
  return {
    get: async (id) => (await floorBlock(t, id))?.items.find((o) => o.id === id),
    present: async (ids) => {
      const out = new Map<string, Observation>();
      if (ids.length === 0) return out;
      const wanted = new Set(ids);
      for (const block of await blocksSpanning(t, ids)) for (const o of block.items) if (wanted.has(o.id)) out.set(o.id, o);
      return out;
    },
    all: async () => flat(await t.toArray()),
    count: async () => {
      let n = 0;
      await t.each((block) => {
        n += block.items.length;
      });
      return n;
    },
    page: (after, limit) => observationPage(t, after, limit),
    ofPatient: async (patientId) => flat(await t.where('patientIds').equals(patientId).toArray()).filter((o) => o.patientId === patientId),
    changedSince: changed,
    countChangedSince: async (mark) => (await changed(mark)).length,
    add: (rows) => write(t, rows, 'add'),
    put: (rows) => write(t, rows, 'put'),
    remove: (ids) => removeObservations(t, ids),
  };
}

/** Up to `limit` observations with an id after `after`, in id order: the floor block's tail, then whole blocks above. */
async function observationPage(t: Table<ObservationBlock, string>, after: string | null, limit: number): Promise<Observation[]> {
  const out: Observation[] = [];
  if (limit <= 0) return out;
  if (after !== null) for (const o of (await floorBlock(t, after))?.items ?? []) if (o.id > after && out.length < limit) out.push(o);
  let key = after;
  while (out.length < limit) {
    const blocks = await (key === null ? t.orderBy(':id') : t.where(':id').above(key)).limit(Math.ceil((limit - out.length) / BLOCK_SIZE) + 1).toArray();
    if (blocks.length === 0) break;
    for (const block of blocks) for (const o of block.items) if (out.length < limit) out.push(o);
    key = blocks[blocks.length - 1]!.id;
  }
  return out;
}

/** The block that holds (or would hold) `id`: the one with the greatest key ≤ id. */
async function floorBlock(t: Table<ObservationBlock, string>, id: string): Promise<ObservationBlock | undefined> {
  return t.where(':id').belowOrEqual(id).last();
}

/** Every block that holds or would hold one of `ids`, in key order. */
async function blocksSpanning(t: Table<ObservationBlock, string>, ids: readonly string[]): Promise<ObservationBlock[]> {
  let lowest = ids[0]!;
  let highest = ids[0]!;
  for (const id of ids) {
    if (id < lowest) lowest = id;
    if (id > highest) highest = id;
  }
  const [floor, inside] = await Promise.all([floorBlock(t, lowest), lowest === highest ? [] : t.where(':id').between(lowest, highest, false, true).toArray()]);
  return floor ? [floor, ...inside.filter((b) => b.id !== floor.id)] : inside;
}

/**
 * Adds or replaces observations: reads the blocks their ids fall in, merges, splits blocks grown
 * past BLOCK_SIZE and writes the changed blocks, inside the caller's transaction. 'add' refuses an
 * id already stored (ConstraintError, like IndexedDB's add), so the transaction aborts and nothing
 * of it is kept.
 */
async function write(t: Table<ObservationBlock, string>, rows: readonly Observation[], mode: 'add' | 'put'): Promise<void> {
  if (rows.length === 0) return;
  const incoming = [...rows].sort(byId);
  for (let i = 1; i < incoming.length; i++) {
    if (incoming[i]!.id === incoming[i - 1]!.id) throw constraintError(`observation ${incoming[i]!.id} twice in one write`);
  }
  const blocks = await blocksSpanning(t, incoming.map((o) => o.id));
  // Each incoming observation goes to the last block whose key is ≤ its id; ids below every block
  // go to the first block (which is then keyed anew), or to new blocks when there is none.
  const groups = new Map<ObservationBlock | null, Observation[]>();
  let b = 0;
  for (const o of incoming) {
    while (b + 1 < blocks.length && blocks[b + 1]!.id <= o.id) b++;
    const target = blocks[b] ?? null;
    const list = groups.get(target);
    if (list) list.push(o);
    else groups.set(target, [o]);
  }
  const puts: ObservationBlock[] = [];
  const deletes: string[] = [];
  for (const [block, added] of groups) {
    let items: Observation[];
    if (!block) items = added;
    else {
      const byKey = new Map(block.items.map((o) => [o.id, o] as const));
      for (const o of added) {
        if (mode === 'add' && byKey.has(o.id)) throw constraintError(`observation ${o.id} exists already`);
        byKey.set(o.id, o);
      }
      items = [...byKey.values()].sort(byId);
    }
    const pieces = items.length > BLOCK_SIZE ? split(items) : [makeBlock(items)];
    if (block && pieces[0]!.id !== block.id) deletes.push(block.id);
    puts.push(...pieces);
  }
  declareWrites(incoming);
  if (deletes.length > 0) await t.bulkDelete(deletes);
  // Keys of new blocks are ids no block holds yet, so a put never overwrites another block.
  await t.bulkPut(puts);
}

/** What the observation writes of one transaction brought: their patients and how many observations. */
export interface DeclaredObservationWrites {
  readonly patients: ReadonlySet<string>;
  readonly rows: number;
}
const declared = new WeakMap<object, { patients: Set<string>; rows: number }>();

/**
 * The observations `write` has put in this native transaction so far, or undefined when none was
 * declared (a write outside an explicit transaction). A stored block holds other patients'
 * observations too, and a block split deletes and puts blocks whose observations do not change:
 * the caseload summaries' middleware marks these patients instead of every patient of the blocks
 * written, so saving one visit recomputes that patient's summary only. Every write to the
 * observation store goes through `write` or `removeObservations` (schema upgrades excepted, which rebuild
 * the summaries).
 */
export function declaredObservationWrites(trans: object): DeclaredObservationWrites | undefined {
  return declared.get(trans);
}

/** Records the incoming observations on the current explicit transaction, before any block is written. */
function declareWrites(incoming: readonly Observation[]): void {
  const trans = Dexie.currentTransaction?.idbtrans as object | undefined;
  if (!trans) return;
  let entry = declared.get(trans);
  if (!entry) declared.set(trans, (entry = { patients: new Set(), rows: 0 }));
  for (const o of incoming) entry.patients.add(o.patientId);
  entry.rows += incoming.length;
}

/** Takes observations out of their blocks (a block left empty goes; one that lost its lowest id is keyed anew). */
async function removeObservations(t: Table<ObservationBlock, string>, ids: readonly string[]): Promise<void> {
  if (ids.length === 0) return;
  const gone = new Set(ids);
  const deletes: string[] = [];
  const puts: ObservationBlock[] = [];
  const blocks = await blocksSpanning(t, ids);
  // The summaries' middleware marks the declared patients only: the removed observations' patients too.
  declareWrites(blocks.flatMap((block) => block.items.filter((o) => gone.has(o.id))));
  for (const block of blocks) {
    const items = block.items.filter((o) => !gone.has(o.id));
    if (items.length === block.items.length) continue;
    if (items.length === 0 || items[0]!.id !== block.id) deletes.push(block.id);
    if (items.length > 0) puts.push(makeBlock(items));
  }
  if (deletes.length > 0) await t.bulkDelete(deletes);
  if (puts.length > 0) await t.bulkPut(puts);
}

/** The error IndexedDB's add gives for a key already stored. */
function constraintError(message: string): Error {
  return Object.assign(new Error(message), { name: 'ConstraintError' });
}

/** A block grown past BLOCK_SIZE: full blocks from the front, the rest in the last one. */
function split(items: readonly Observation[]): ObservationBlock[] {
  return packObservations(items);
}

/**
 * One patient's observations of one measure in time order (takenAt, then id), tombstones included.
 */
export async function observationSeries(db: Dexie, patientId: string, measureCode: string): Promise<Observation[]> {
  const rows = (await observationRows(db).ofPatient(patientId)).filter((o) => o.measureCode === measureCode);
  return rows.sort((a, b) => (a.takenAt < b.takenAt ? -1 : a.takenAt > b.takenAt ? 1 : byId(a, b)));
}

/** Every observation, at the DBCore level inside `trans` (the caseload summaries' middleware). */
export async function coreAllObservations(down: DBCore, trans: DBCoreTransaction): Promise<Observation[]> {
  const core = down.table(OBSERVATIONS_STORE);
  const blocks = (await core.query({ trans, values: true, query: { index: core.schema.primaryKey, range: ANY_RANGE } })).result as ObservationBlock[];
  return blocks.flatMap((b) => b.items);
}

/** One patient's observations, at the DBCore level inside `trans`. */
export async function coreObservationsOfPatient(down: DBCore, trans: DBCoreTransaction, patientId: string): Promise<Observation[]> {
  const core = down.table(OBSERVATIONS_STORE);
  const index = core.schema.getIndexByKeyPath('patientIds');
  if (!index) throw new Error('observations have no patientIds index');
  const blocks = (await core.query({ trans, values: true, query: { index, range: equalRange(patientId) } })).result as ObservationBlock[];
  return blocks.flatMap((b) => b.items).filter((o) => o.patientId === patientId);
}
