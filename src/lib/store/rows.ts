import type { Assessment, ClinicalEvent, Identity, IdentityFields, RecordBase, RecordTables, TableName } from '../domain';
import type { SealedText } from './crypto-box';

/**
 * How a record sits in IndexedDB. Protected text never does: an Identity row holds one sealed
 * block, assessments and events hold `notesSealed` instead of `notes`. Every other kind is stored
 * as its domain form (traces keep Float64Array columns, which IndexedDB clones natively).
 */
export type IdentityRow = Omit<Identity, keyof IdentityFields> & { readonly sealed: SealedText };
export type AssessmentRow = Omit<Assessment, 'notes'> & { readonly notesSealed: SealedText | null };
export type EventRow = Omit<ClinicalEvent, 'notes'> & { readonly notesSealed: SealedText | null };

export type RowTables = Omit<RecordTables, 'identities' | 'assessments' | 'events'> & {
  identities: IdentityRow;
  assessments: AssessmentRow;
  events: EventRow;
};
export type Row<K extends TableName> = RowTables[K];

/** Additional data bound to a sealed field: a ciphertext copied to another record or field fails to open. */
export function sealAad(table: TableName, id: string, field: string): string {
  return `kinnote:${table}:${id}:${field}`;
}

export const SEALED_MARKER = '[sealed]';

/**
 * Copy of a row for the audit log: sealed fields become a marker (the log never holds protected
 * text, not even encrypted under a key another device cannot open) and trace samples become a
 * count (the log stays small). The result is plain JSON.
 */
export function auditSnapshot(table: TableName, row: RecordBase): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(row)) {
    if (key === 'sealed' || key.endsWith('Sealed')) out[key] = value === null ? null : SEALED_MARKER;
    else if (table === 'traces' && key === 'channels' && Array.isArray(value)) {
      out[key] = (value as { name: string; unit: string; samples: Float64Array }[]).map((c) => ({
        name: c.name,
        unit: c.unit,
        sampleCount: c.samples.length,
      }));
    } else out[key] = structuredCloneJson(value);
  }
  return out;
}

function structuredCloneJson(value: unknown): unknown {
  if (value === null || typeof value !== 'object') return value;
  if (Array.isArray(value)) return value.map(structuredCloneJson);
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(value)) out[k] = structuredCloneJson(v);
  return out;
}
