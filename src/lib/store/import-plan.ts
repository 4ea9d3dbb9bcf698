import { TABLE_NAMES, type RecordBase, type TableName } from '../domain';
import { toPortable, type VerifiedBundle } from './backup-bundle';
import { canonicalJson } from './canonical-json';
import { settleDiffering } from './import-settle';
import type { ConflictAudit, MergeConflict, Planned, TableCounts } from './import-types';
import type { KinnoteStore } from './open-store';

export interface MergePlan {
  readonly counts: Record<TableName, TableCounts>;
  readonly writes: Planned[];
  /** Local rows kept over an incoming copy: re-checked, not written. */
  readonly checks: Planned[];
  readonly conflicts: MergeConflict[];
  readonly conflictAudits: ConflictAudit[];
}

/**
 * Import step 3 (plan, no writes): decide each incoming record against its local row, seal what is
 * written, collect conflicts. Sealing happens here because awaiting Web Crypto inside an IndexedDB
 * transaction would let it commit early. Absent records are inserted (an audit entry from a file
 * keeps the author it claims, marked `importedBy` this device); identical ones left alone.
 */
export async function planMerge(
  store: KinnoteStore,
  bundle: VerifiedBundle,
  local: Map<TableName, Map<string, RecordBase>>,
  importedBy: { readonly deviceId: string; readonly importedAt: string },
  syncBases: ReadonlyMap<string, string> | undefined,
): Promise<MergePlan> {
  const included = bundle.header.protectedContent === 'included';
  const counts = Object.fromEntries(TABLE_NAMES.map((t) => [t, { inserted: 0, replaced: 0, unchanged: 0, keptLocal: 0 }])) as Record<TableName, TableCounts>;
  const plan: MergePlan = { counts, writes: [], checks: [], conflicts: [], conflictAudits: [] };
  for (const table of TABLE_NAMES) {
    const codec = store.context.codecs[table];
    const localRows = local.get(table)!;
    for (const record of bundle.tables[table] as RecordBase[]) {
      const current = localRows.get(record.id);
      if (!current) {
        const row = table === 'audit' ? { ...toPortable('audit', record), importedBy } : await codec.toRow(record as never);
        plan.writes.push({ table, id: record.id, localUpdatedAt: undefined, row });
        counts[table].inserted++;
        continue;
      }
      const localRecord = included ? await codec.fromRow(current as never) : codec.redact(current as never);
      const texts = { local: canonicalJson(toPortable(table, localRecord as object)), incoming: canonicalJson(toPortable(table, record)) };
      if (texts.local === texts.incoming) {
        counts[table].unchanged++;
        continue;
      }
      const settled = await settleDiffering(store, table, record, current, texts, codec, syncBases);
      const winner = settled.kind === 'ordinary' ? settled.winner : settled.conflict.winner;
      if (settled.kind === 'conflict') {
        plan.conflicts.push(settled.conflict);
        if (settled.audit) plan.conflictAudits.push(settled.audit);
      }
      if (winner === 'incoming') {
        const row = keepSealedWhenOmitted(await codec.toRow(record as never), current, codec.sealedFields, included);
        plan.writes.push({ table, id: record.id, localUpdatedAt: current.updatedAt, row });
        counts[table].replaced++;
      } else {
        // Same outcome either way; only an ordinary one overwrote nobody's change (no conflict).
        if (settled.kind === 'conflict') plan.checks.push({ table, id: record.id, localUpdatedAt: current.updatedAt, row: undefined });
        counts[table].keptLocal++;
      }
    }
  }
  return plan;
}

/** With protected content omitted from the bundle, the local sealed text stays as it was. */
function keepSealedWhenOmitted(row: unknown, current: RecordBase, sealedFields: readonly string[], included: boolean): unknown {
  if (included) return row;
  const kept: Record<string, unknown> = { ...(row as object) };
  for (const f of sealedFields) kept[f] = (current as unknown as Record<string, unknown>)[f];
  return kept;
}
