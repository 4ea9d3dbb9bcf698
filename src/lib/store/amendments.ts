import type { AuditEntry, TableName } from '../domain';
import type { KinnoteStore } from './open-store';
import { StoreError } from './store-error';

/** How an amendment's reason starts in its audit entries: the one mark of "amended" (audit travels in backups and sync). */
export const AMENDMENT_NOTE_PREFIX = 'amended: ';

/**
 * The audit note of an amendment with `reason` (trimmed). Throws StoreError ValidationFailed, naming
 * `record` and the field `reason`, when the reason is empty: an amendment always says why.
 */
export function amendmentNote(reason: string, record: string): string {
  const trimmed = reason.trim();
  if (trimmed === '') throw new StoreError('ValidationFailed', 'an amendment needs a reason', { issues: [{ record, path: 'reason', message: 'say why the record is amended' }] });
  return `${AMENDMENT_NOTE_PREFIX}${trimmed}`;
}

/** One field an amendment changed, as the audit entry holds it (protected text shows only as a sealed marker). */
export interface AmendedField {
  readonly field: string;
  readonly before: unknown;
  readonly after: unknown;
}
/** One amendment of one record, read back from the audit. */
export interface Amendment {
  readonly at: string;
  readonly reason: string;
  readonly changes: readonly AmendedField[];
}

// Stamps every write changes; they say nothing about what the amendment changed.
const STAMPS = new Set(['updatedAt', 'deviceId', 'clinicianId']);

/** The fields that differ between an audit entry's before and after (compared as JSON), stamps left out. */
export function changedFields(entry: Pick<AuditEntry, 'before' | 'after'>): AmendedField[] {
  const before = (entry.before ?? {}) as Record<string, unknown>;
  const after = (entry.after ?? {}) as Record<string, unknown>;
  const out: AmendedField[] = [];
  for (const field of new Set([...Object.keys(before), ...Object.keys(after)])) {
    if (STAMPS.has(field)) continue;
    if (JSON.stringify(before[field]) !== JSON.stringify(after[field])) out.push({ field, before: before[field] ?? null, after: after[field] ?? null });
  }
  return out;
}

/**
 * The amendments of records of one table, oldest first, read from the audit log's [table+recordId]
 * index (one range read per record). A record without any is left out of the map, so "has an entry"
 * is the amended mark: a delete followed by undo is not an amendment.
 */
export async function amendmentsOf(store: KinnoteStore, table: TableName, ids: readonly string[]): Promise<Map<string, Amendment[]>> {
  const out = new Map<string, Amendment[]>();
  if (ids.length === 0) return out;
  const entries = (await store.db
    .table('audit')
    .where('[table+recordId]')
    .anyOf(ids.map((id) => [table, id]))
    .toArray()) as AuditEntry[];
  entries.sort((a, b) => (a.id < b.id ? -1 : 1));
  for (const e of entries) {
    if (e.recordId === null || !e.note?.startsWith(AMENDMENT_NOTE_PREFIX)) continue;
    const list = out.get(e.recordId) ?? [];
    list.push({ at: e.createdAt, reason: e.note.slice(AMENDMENT_NOTE_PREFIX.length), changes: changedFields(e) });
    out.set(e.recordId, list);
  }
  return out;
}
