import { TABLE_NAMES, referencedIds, type TableName } from '../domain';
import type { BundleTables } from './backup-bundle';
import { StoreError, describeIssues, type StoreIssue } from './store-error';

/** Finds which of `ids` exist in `table` outside the bundle (the store being imported into); none when there is no store. */
export type OutsideLookup = (table: TableName, ids: readonly string[]) => Promise<ReadonlySet<string>>;

/**
 * Checks that every reference in the bundle (RECORD_REFERENCES: an observation's patient,
 * assessment and trace, an identity's patient, an audit entry's record, …) resolves to a record of
 * the right table, in the bundle or, through `outside`, in the store. Ids the caller vouches for
 * (`known`, e.g. the patient a phone's programme is for, whose record never reaches the phone) are
 * accepted as patients. With `identitiesOmitted` (a backup without names and notes), references to
 * identities (the audit entries of a patient's identity) need not resolve: the backup leaves every
 * identity out by design, so refusing them made such a backup unreadable on a new device. Throws StoreError InvalidBundle naming record, field and the missing id;
 * writes nothing. Cost: one pass over the records and one lookup per table with unresolved ids.
 */
export async function checkReferences(
  tables: BundleTables,
  outside: OutsideLookup | null,
  known: { readonly patientIds?: readonly string[]; readonly identitiesOmitted?: boolean } = {},
): Promise<void> {
  const inBundle = new Map<TableName, Set<string>>(TABLE_NAMES.map((t) => [t, new Set(tables[t].map((r) => r.id))]));
  for (const id of known.patientIds ?? []) inBundle.get('patients')!.add(id);
  const pending: { where: string; field: string; target: TableName; id: string }[] = [];
  for (const table of TABLE_NAMES) {
    (tables[table] as unknown as Record<string, unknown>[]).forEach((record, i) => {
      for (const ref of referencedIds(table, record, TABLE_NAMES)) {
        if (ref.target === 'identities' && known.identitiesOmitted === true) continue;
        if (!inBundle.get(ref.target)!.has(ref.id)) pending.push({ where: `tables.${table}[${i}] (${String(record.id)})`, ...ref });
      }
    });
  }
  if (pending.length === 0) return;
  const found = new Map<TableName, ReadonlySet<string>>();
  if (outside) {
    for (const target of new Set(pending.map((p) => p.target))) {
      found.set(target, await outside(target, [...new Set(pending.filter((p) => p.target === target).map((p) => p.id))]));
    }
  }
  const issues: StoreIssue[] = pending
    .filter((p) => !found.get(p.target)?.has(p.id))
    .map((p) => ({ record: p.where, path: p.field, message: `refers to ${p.target} ${p.id}, which is neither in this backup nor on this device` }));
  if (issues.length > 0) throw new StoreError('InvalidBundle', `invalid backup, nothing imported: ${describeIssues(issues)}`, { issues });
}
