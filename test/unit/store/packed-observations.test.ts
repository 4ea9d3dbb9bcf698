// Schema 16: observations packed several to a stored value (src/lib/store/observation-rows.ts).
// The oracle is a plain Map of the observations written, filtered and sorted here with Array methods
// (not the store's code); the raw object store is read with IndexedDB's own getAll to check the
// layout's invariants.
import { describe, expect, it } from 'vitest';
import Dexie from 'dexie';
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import type { Observation } from '../../../src/lib/domain';
import { LATEST_SCHEMA_VERSION, openStore } from '../../../src/lib/store';
import { declareSchema } from '../../../src/lib/store/schema';
import { BLOCK_SIZE, type ObservationBlock } from '../../../src/lib/store/observation-rows';
import { tableRows } from '../../../src/lib/store/table-rows';
import { mulberry32 } from '../../support/seeded-random';

const hex = (n: number, width: number) => n.toString(16).padStart(width, '0');
/** UUIDv7-shaped ids whose order follows `ms` (the time part), then `seq`. */
const idAt = (ms: number, seq: number) => `${hex(ms, 12).slice(0, 8)}-${hex(ms, 12).slice(8)}-7${hex(seq % 4096, 3)}-8${hex(seq, 15).slice(0, 3)}-${hex(seq, 15).slice(3)}`;
const patientIds = ['0190a0b0-0000-7000-8000-00000000000a', '0190a0b0-0000-7000-8000-00000000000b', '0190a0b0-0000-7000-8000-00000000000c', '0190a0b0-0000-7000-8000-00000000000d'];
const measures = ['mas', 'tardieu-r1', 'prom'];

function observation(rng: () => number, ms: number, seq: number): Observation {
  const patientId = patientIds[Math.floor(rng() * patientIds.length)]!;
  // takenAt is not in id order (a visit's time is entered, ids are stamped when saved); ties happen.
  const takenAt = new Date(Date.UTC(2025, 0, 1) + Math.floor(rng() * 40) * 86_400_000).toISOString();
  const stamp = new Date(Date.UTC(2025, 0, 1) + Math.floor(rng() * 90) * 3_600_000).toISOString();
  return {
    id: idAt(ms, seq),
    createdAt: stamp,
    updatedAt: stamp,
    deviceId: '0190a0b0-0000-7000-8000-000000000900',
    clinicianId: '0190a0b0-0000-7000-8000-000000000901',
    deleted: rng() < 0.1,
    patientId,
    assessmentId: '0190a0b0-0000-7000-8000-000000000777',
    takenAt,
    measureCode: measures[Math.floor(rng() * measures.length)]!,
    siteCode: 'elbow-flexors',
    side: 'left',
    mode: null,
    instrument: null,
    value: { kind: 'ordinal', grade: '1+', rank: 2 },
    traceId: null,
  } as unknown as Observation;
}

const byId = (a: { id: string }, b: { id: string }) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);

async function rawBlocks(db: Dexie): Promise<ObservationBlock[]> {
  const idb = db.backendDB();
  return new Promise((resolve, reject) => {
    const request = idb.transaction('observations').objectStore('observations').getAll();
    request.onsuccess = () => resolve(request.result as ObservationBlock[]);
    request.onerror = () => reject(request.error);
  });
}

/** The layout's invariants: blocks partition the id space, each sorted, bounded, with true index fields. */
function expectWellFormed(blocks: readonly ObservationBlock[]): void {
  for (const [i, b] of blocks.entries()) {
    expect(b.items.length, `block ${i} size`).toBeGreaterThan(0);
    expect(b.items.length, `block ${i} size`).toBeLessThanOrEqual(BLOCK_SIZE);
    expect(b.id, `block ${i} key`).toBe(b.items[0]!.id);
    expect(b.items.map((o) => o.id), `block ${i} order`).toEqual(b.items.map((o) => o.id).sort());
    const next = blocks[i + 1];
    if (next) expect(b.items[b.items.length - 1]!.id < next.id, `block ${i} ends before the next`).toBe(true);
    expect([...b.patientIds].sort(), `block ${i} patients`).toEqual([...new Set(b.items.map((o) => o.patientId))].sort());
    expect(b.changedAt, `block ${i} changedAt`).toBe(b.items.map((o) => o.updatedAt).sort().at(-1));
  }
}

describe('packed observations (schema 16)', () => {
  it('v14 → v16: every observation, tombstones included, moves into blocks unchanged and reads back as before', async () => {
    const rng = mulberry32(1603);
    const factory = new IDBFactory();
    const old = new Dexie('kinnote', { indexedDB: factory, IDBKeyRange });
    declareSchema(old, 14);
    await old.open();
    // 450 rows (more than two blocks), written out of id order as a merged backup would leave them.
    const rows = Array.from({ length: 450 }, (_, i) => observation(rng, 1_735_000_000_000 + ((i * 7919) % 450) * 1000, i));
    await old.table('observations').bulkAdd(rows);
    old.close();

    const store = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    expect(store.db.verno).toBe(LATEST_SCHEMA_VERSION);
    const blocks = await rawBlocks(store.db);
    expect(blocks.length).toBe(Math.ceil(rows.length / BLOCK_SIZE));
    expectWellFormed(blocks);
    const sorted = [...rows].sort(byId);
    expect(await store.observations.list({ includeDeleted: true })).toEqual(sorted);
    expect(await store.observations.list()).toEqual(sorted.filter((o) => !o.deleted));
    for (const p of patientIds) {
      expect(await store.observations.byPatient(p, { includeDeleted: true })).toEqual(sorted.filter((o) => o.patientId === p));
      for (const m of measures) {
        const series = sorted.filter((o) => o.patientId === p && o.measureCode === m && !o.deleted).sort((a, b) => a.takenAt.localeCompare(b.takenAt) || byId(a, b));
        expect(await store.observations.series(p, m)).toEqual(series);
      }
    }
    for (const o of [sorted[0]!, sorted[199]!, sorted[200]!, sorted[449]!]) expect(await store.observations.get(o.id)).toEqual(o);
    expect(await store.observations.get(idAt(1, 1))).toBeUndefined();
    const mark = '2025-01-02T12:00:00.000Z';
    expect((await tableRows(store.db, 'observations').changedSince(mark)).sort(byId)).toEqual(sorted.filter((o) => o.updatedAt > mark));
    store.close();
  });

  it('a seeded mix of adds and puts, ids in and out of order, keeps the blocks well formed and equal to a plain map', async () => {
    const rng = mulberry32(20261203);
    const store = await openStore({ indexedDB: new IDBFactory(), IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    const rows = tableRows<Observation>(store.db, 'observations');
    const oracle = new Map<string, Observation>();
    let seq = 0;
    for (let step = 0; step < 60; step++) {
      const kind = rng();
      const count = 1 + Math.floor(rng() * (rng() < 0.2 ? 600 : 30));
      let batch: Observation[];
      if (kind < 0.5 || oracle.size === 0) {
        // New ids: mostly later than every stored one (this device), sometimes anywhere (a teammate's).
        const base = kind < 0.35 ? 1_800_000_000_000 + step * 10_000_000 : 1_700_000_000_000 + Math.floor(rng() * 200_000_000_000);
        batch = Array.from({ length: count }, () => observation(rng, base + Math.floor(rng() * 1_000_000), seq++));
        await store.db.transaction('rw', ['observations'], () => rows.add(batch));
      } else {
        // Replacements of stored ones (an edit, a tombstone, a newer pulled copy) and some new ids.
        const stored = [...oracle.values()];
        const chosen = new Map<string, Observation>();
        for (let i = 0; i < count; i++) {
          const o = stored[Math.floor(rng() * stored.length)]!;
          chosen.set(o.id, { ...o, deleted: !o.deleted, updatedAt: new Date(Date.UTC(2025, 5, 1) + step * 1000).toISOString() });
        }
        if (rng() < 0.5) for (let i = 0; i < 3; i++) { const o = observation(rng, 1_750_000_000_000 + Math.floor(rng() * 1e9), seq++); chosen.set(o.id, o); }
        batch = [...chosen.values()];
        await store.db.transaction('rw', ['observations'], () => rows.put(batch));
      }
      for (const o of batch) oracle.set(o.id, o);
      expectWellFormed(await rawBlocks(store.db));
    }
    const expected = [...oracle.values()].sort(byId);
    expect(await rows.all()).toEqual(expected);
    for (const p of patientIds) expect(await rows.ofPatient(p)).toEqual(expected.filter((o) => o.patientId === p));
    const probe = expected.filter((_, i) => i % 37 === 0).map((o) => o.id);
    expect([...(await rows.present([...probe, idAt(5, 5)])).keys()].sort()).toEqual(probe);
    // Paged reads (the streamed backup): pages of awkward sizes, from the start and from ids inside
    // and between blocks, equal slices of the sorted oracle; walking the pages visits every row once.
    expect(await rows.count()).toBe(expected.length);
    for (const size of [1, 7, BLOCK_SIZE, BLOCK_SIZE + 3, 500]) {
      const walked: Observation[] = [];
      for (let after: string | null = null; ; ) {
        const page = await rows.page(after, size);
        if (page.length === 0) break;
        expect(page.length).toBeLessThanOrEqual(size);
        walked.push(...page);
        after = page[page.length - 1]!.id;
      }
      expect(walked.map((o) => o.id)).toEqual(expected.map((o) => o.id));
    }
    for (const from of [expected[0]!.id, expected[77]!.id, idAt(1_750_000_000_000, 0), idAt(1, 1)]) {
      expect(await rows.page(from, 60)).toEqual(expected.filter((o) => o.id > from).slice(0, 60));
    }
    store.close();
  });

  it('an add of an id already stored fails and leaves every block as it was (all or nothing)', async () => {
    const rng = mulberry32(7);
    const store = await openStore({ indexedDB: new IDBFactory(), IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    const rows = tableRows<Observation>(store.db, 'observations');
    const first = Array.from({ length: 250 }, (_, i) => observation(rng, 1_800_000_000_000 + i, i));
    await store.db.transaction('rw', ['observations'], () => rows.add(first));
    const before = await rawBlocks(store.db);
    const again = [observation(rng, 1_900_000_000_000, 999), { ...first[120]!, deleted: true }];
    await expect(store.db.transaction('rw', ['observations'], () => rows.add(again))).rejects.toMatchObject({ name: 'ConstraintError' });
    expect(await rawBlocks(store.db)).toEqual(before);
    store.close();
  });
});
