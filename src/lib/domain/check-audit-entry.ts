import type { AuditEntry } from './audit-entry';
import type { ValidationIssue } from './domain-error';
import { IdentityFieldsSchema } from './identity';

/** Largest audit snapshot accepted, in characters of its JSON (a reliability study with its trials fits many times over). */
export const MAX_AUDIT_SNAPSHOT_CHARS = 200_000;

const SEALED_MARKER = '[sealed]';
const IDENTITY_FIELDS: readonly string[] = Object.keys(IdentityFieldsSchema.entries);

/**
 * Checks what the audit schema cannot: `table` names a record table (or "*" for the whole store),
 * each snapshot is at most MAX_AUDIT_SNAPSHOT_CHARS of JSON, and no snapshot holds protected text
 * in clear. An identity's fields (names, date of birth, contact) may appear nowhere in a snapshot,
 * at any depth; the protected fields of `table` (e.g. an assessment's notes) only as null or the
 * "[sealed]" marker the store writes. Returns the issues (empty when valid); never throws.
 */
export function checkAuditEntry(
  entry: AuditEntry,
  tableNames: readonly string[],
  protectedFields: { readonly [table: string]: readonly string[] | undefined },
): ValidationIssue[] {
  const issues: ValidationIssue[] = [];
  if (entry.table !== '*' && !tableNames.includes(entry.table)) {
    issues.push({ path: 'table', message: `"${entry.table.slice(0, 40)}${entry.table.length > 40 ? '…' : ''}" is not a record table` });
  }
  for (const side of ['before', 'after'] as const) {
    const snapshot = entry[side];
    if (snapshot === null) continue;
    let size: number;
    try {
      size = JSON.stringify(snapshot).length;
    } catch {
      issues.push({ path: side, message: 'is not plain JSON' });
      continue;
    }
    if (size > MAX_AUDIT_SNAPSHOT_CHARS) issues.push({ path: side, message: `is ${size} characters of JSON; at most ${MAX_AUDIT_SNAPSHOT_CHARS}` });
    const leak = identityFieldPath(snapshot, side);
    if (leak !== null) issues.push({ path: leak, message: 'protected identity text in an audit snapshot (the store never writes it there)' });
    for (const field of protectedFields[entry.table] ?? []) {
      const value = snapshot[field];
      if (value !== undefined && value !== null && value !== SEALED_MARKER) {
        issues.push({ path: `${side}.${field}`, message: 'protected text in clear in an audit snapshot (the store writes only "[sealed]")' });
      }
    }
  }
  return issues;
}

/** Dot path of the first identity field found at any depth with a value other than null or the marker, else null. */
function identityFieldPath(value: unknown, path: string): string | null {
  if (value === null || typeof value !== 'object') return null;
  for (const [key, inner] of Object.entries(value)) {
    if (IDENTITY_FIELDS.includes(key) && inner !== null && inner !== SEALED_MARKER) return `${path}.${key}`;
    const found = identityFieldPath(inner, `${path}.${key}`);
    if (found !== null) return found;
  }
  return null;
}
