import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { ordinalValue, type Observation } from '../../../src/lib/domain';
import { StoreError, canonicalJson, type KinnoteStore } from '../../../src/lib/store';
import { BATCH_AUDIT_MIN_RECORDS, canonicalObservationsJson } from '../../../src/lib/store/batch-audit';
import { plausibleObservation } from '../../support/generated-observations';
import { mulberry32 } from '../../support/seeded-random';
import { dumpAll, freshStore, seedPatient } from './store-helpers';
import { tableRows } from '../../../src/lib/store/table-rows';

async function inputs(store: KinnoteStore, n: number) {
  const { patient, assessment } = await seedPatient(store);
  return Array.from({ length: n }, (_, i) => ({
    patientId: patient.id,
    assessmentId: assessment.id,
    takenAt: assessment.performedAt,
    measureCode: 'mas',
    siteCode: 'elbow-flexors',
    side: (i % 2 ? 'left' : 'right') as 'left' | 'right',
    mode: null,
    instrument: null,
    value: ordinalValue('mas', ['0', '1', '1+', '2'][i % 4]!),
    traceId: null,
  }));
}

// The digest is checked with Node's own SHA-256 (node:crypto), not the store's Web Crypto helper.
const nodeSha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

describe('batch audit entries for bulk creates', () => {
  it(`one entry for a batch of ${BATCH_AUDIT_MIN_RECORDS}: ids, count and a digest that an auditor can recompute from the records`, async () => {
    const store = await freshStore();
    const batch = await inputs(store, BATCH_AUDIT_MIN_RECORDS);
    const before = await store.audit.count();
    const rows = await store.observations.createMany(batch);
    expect(await store.audit.count()).toBe(before + 1);
    const [entry] = await store.audit.recent(1);
    expect(entry).toMatchObject({ action: 'create', table: 'observations', recordId: null, before: null, deviceId: store.actor!.deviceId, clinicianId: store.actor!.clinicianId });
    const after = entry!.after as { recordIds: string[]; count: number; digest: { algorithm: string; value: string } };
    expect(after.recordIds).toEqual(rows.map((r) => r.id));
    expect(after.count).toBe(rows.length);
    // Reconstruction from what is stored: the rows as they are now (none changed since).
    const present = await tableRows(store.db, 'observations').present(after.recordIds);
    const stored = after.recordIds.map((id) => present.get(id));
    expect(after.digest.value).toBe(nodeSha256(canonicalJson(stored)));
    // Each record's history names the batch entry.
    expect((await store.audit.forRecord('observations', rows[7]!.id)).map((e) => e.id)).toEqual([entry!.id]);
    store.close();
  });

  it('after a later change the creation state is the change entry\'s before, and the digest still matches', async () => {
    const store = await freshStore();
    const rows = await store.observations.createMany(await inputs(store, BATCH_AUDIT_MIN_RECORDS + 5));
    const changed = rows[3]!;
    await store.observations.update(changed.id, { value: ordinalValue('mas', '3') });
    await store.observations.remove(rows[4]!.id);
    const history = await store.audit.forRecord('observations', changed.id);
    expect(history.map((e) => e.action)).toEqual(['create', 'update']);
    const batch = history[0]!.after as { recordIds: string[]; digest: { value: string } };
    const current = await tableRows(store.db, 'observations').present(batch.recordIds);
    const now = batch.recordIds.map((id) => current.get(id));
    // Current rows no longer match (one changed, one tombstoned) ...
    expect(nodeSha256(canonicalJson(now))).not.toBe(batch.digest.value);
    // ... the states rebuilt from the first later entry of each record do.
    const rebuilt = [];
    for (const [i, id] of batch.recordIds.entries()) {
      const later = (await store.audit.forRecord('observations', id)).filter((e) => e.recordId === id);
      rebuilt.push(later.length > 0 ? later[0]!.before : now[i]);
    }
    expect(nodeSha256(canonicalJson(rebuilt))).toBe(batch.digest.value);
    store.close();
  });

  it('below the threshold every record keeps its own entry with a full snapshot', async () => {
    const store = await freshStore();
    const batch = await inputs(store, BATCH_AUDIT_MIN_RECORDS - 1);
    const before = await store.audit.count();
    const rows = await store.observations.createMany(batch);
    expect(await store.audit.count()).toBe(before + rows.length);
    const [entry] = await store.audit.forRecord('observations', rows[0]!.id);
    expect(entry!.after).toMatchObject({ id: rows[0]!.id, measureCode: 'mas' });
    store.close();
  });

  it('one invalid record refuses the whole batch: no record, no batch entry', async () => {
    const store = await freshStore();
    const batch = await inputs(store, BATCH_AUDIT_MIN_RECORDS * 2);
    batch[150] = { ...batch[150]!, siteCode: 'no-such-site' };
    const snapshot = await dumpAll(store);
    const error = await store.observations.createMany(batch).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(StoreError);
    expect((error as StoreError).issues[0]).toMatchObject({ record: 'observations[150]' });
    expect(await dumpAll(store)).toEqual(snapshot);
    store.close();
  });

  it('writes the digest text of observations as canonicalJson does, for every kind of value', () => {
    const rand = mulberry32(17);
    const rows = Array.from({ length: 3000 }, () => plausibleObservation(rand)) as unknown as Observation[];
    // Edges: negative zero, exponent forms, long fractions, codes JSON must escape.
    const edges = [-0, 1e21, 1.5e-7, 0.1 + 0.2, -123.456];
    rows.push(...edges.map((x, i) => ({ ...rows[i]!, value: { kind: 'angle' as const, angleDeg: x } })));
    rows.push({ ...rows[0]!, measureCode: 'a"b\\c', siteCode: 'tab\there\u2028é', value: { kind: 'ordinal', grade: '1"+', rank: -0 } });
    expect(new Set(rows.map((r) => r.value.kind)).size).toBe(6);
    expect(canonicalObservationsJson(rows)).toBe(canonicalJson(rows));
    expect(canonicalObservationsJson([])).toBe(canonicalJson([]));
  });
});
