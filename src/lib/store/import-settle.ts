import type { RecordBase, TableName } from '../domain';
import type { KinnoteStore } from './open-store';
import { SEALED_MARKER, auditSnapshot } from './rows';
import type { ConflictAudit, MergeConflict } from './import-types';

/** What settling one record present on both sides with different content decided. */
export type Settled =
  | { readonly kind: 'ordinary'; readonly winner: 'incoming' | 'local' }
  | { readonly kind: 'conflict'; readonly conflict: MergeConflict; readonly audit: ConflictAudit | null };

/**
 * Import step 3b (plan, one differing record): the newer updatedAt wins (equal times: the larger
 * canonical text, so every device settles alike); audit entries are append-only, so a differing
 * copy never replaces the local one. With `syncBases` (a team server pull), a local copy still at
 * its base is replaced as an ordinary edit, and an older copy this device wrote itself is its own
 * past: both without a conflict. Otherwise a conflict, with its audit unless an earlier import
 * already recorded this very one.
 */
export async function settleDiffering(
  store: KinnoteStore,
  table: TableName,
  record: RecordBase,
  current: RecordBase,
  texts: { readonly incoming: string; readonly local: string },
  codec: { readonly protectedFields: readonly string[]; readonly sealedFields: readonly string[] },
  syncBases: ReadonlyMap<string, string> | undefined,
): Promise<Settled> {
  const tie = record.updatedAt === current.updatedAt;
  const incomingWins = tie ? texts.incoming > texts.local : record.updatedAt > current.updatedAt;
  const winner: 'incoming' | 'local' = incomingWins && table !== 'audit' ? 'incoming' : 'local';
  const base = syncBases?.get(`${table}/${record.id}`);
  // (A local copy at its base is the server's own earlier copy: whatever replaced it there, even by
  // a tie-break, was settled and listed by the server.)
  const ordinary =
    syncBases !== undefined &&
    ((winner === 'incoming' && base === current.updatedAt) || (winner === 'local' && !tie && record.deviceId === current.deviceId && table !== 'audit'));
  if (ordinary) return { kind: 'ordinary', winner };
  const alreadyRecorded = winner === 'local' && (await keepLocalRecorded(store, table, record.id, current.updatedAt, record.updatedAt));
  const conflict: MergeConflict = {
    table,
    recordId: record.id,
    localUpdatedAt: current.updatedAt,
    incomingUpdatedAt: record.updatedAt,
    winner,
    reason: tie ? 'tie-break' : 'newer',
    alreadyRecorded,
  };
  const audit = alreadyRecorded ? null : { conflict, before: auditSnapshot(table, current), after: snapshotInClear(table, record, codec.protectedFields, codec.sealedFields) };
  return { kind: 'conflict', conflict, audit };
}

async function keepLocalRecorded(store: KinnoteStore, table: TableName, recordId: string, localUpdatedAt: string, incomingUpdatedAt: string): Promise<boolean> {
  const entries = await store.audit.forRecord(table, recordId);
  return entries.some(
    (e) =>
      e.action === 'merge-keep-local' &&
      (e.before as { updatedAt?: unknown } | null)?.updatedAt === localUpdatedAt &&
      (e.after as { updatedAt?: unknown } | null)?.updatedAt === incomingUpdatedAt,
  );
}

/** Audit snapshot of a record in clear: protected fields become the sealed marker, as for a stored row. */
function snapshotInClear(table: TableName, record: RecordBase, protectedFields: readonly string[], sealedFields: readonly string[]): Record<string, unknown> {
  const copy: Record<string, unknown> = { ...record };
  let any = false;
  for (const f of protectedFields) {
    if (copy[f] !== null && copy[f] !== undefined) any = true;
    delete copy[f];
  }
  for (const f of sealedFields) copy[f] = any ? SEALED_MARKER : null;
  return auditSnapshot(table, copy as unknown as RecordBase);
}
