import * as v from 'valibot';
import { isTableName, validateRecord, type TableName, type ValidationIssue } from '../domain';
import { base64ToFloat64 } from '../store';

/**
 * A record as it travels to and from the team server ("wire form"): the domain record, except that
 * protected text is sealed under the team key (AES-GCM, `{ iv, ct }` base64) so the server never
 * holds it in clear: an identity's name, date of birth and contact become one `sealed` block, an
 * assessment's or event's `notes` become `notesSealed`. Trace samples are base64 of float64 LE, as
 * in backups.
 */
export type WireRecord = Record<string, unknown> & { readonly id: string; readonly updatedAt: string; readonly deleted: boolean; readonly deviceId: string };

const Base64 = v.pipe(v.string(), v.regex(/^[A-Za-z0-9+/]*={0,2}$/, 'must be base64'), v.maxLength(200_000));
export const SealedSchema = v.strictObject({ iv: v.pipe(Base64, v.length(16, 'must be a 12-byte iv in base64')), ct: Base64 });

/** Fields sealed on the wire, by table. */
export const WIRE_SEALED_FIELDS: { readonly [K in TableName]?: { readonly sealed: string; readonly clear: readonly string[]; readonly nullable: boolean } } = {
  identities: { sealed: 'sealed', clear: ['familyName', 'givenName', 'dateOfBirth', 'contact'], nullable: false },
  assessments: { sealed: 'notesSealed', clear: ['notes'], nullable: true },
  events: { sealed: 'notesSealed', clear: ['notes'], nullable: true },
};

/** Additional data bound to a team-sealed field, so a ciphertext moved to another record or field fails to open. */
export function wireAad(table: TableName, id: string, field: string): string {
  return `kinnote-team:${table}:${id}:${field}`;
}

/**
 * Checks a wire record with the domain's own schemas: the sealed block is checked as ciphertext, the
 * clear fields it stands for must be absent, and everything else is validated as the domain record
 * (with placeholders where the sealed fields were). Never throws; the issues carry dot paths.
 */
export function checkWireRecord(table: string, value: unknown): { ok: true; table: TableName; record: WireRecord } | { ok: false; issues: ValidationIssue[] } {
  if (!isTableName(table)) return { ok: false, issues: [{ path: 'table', message: `"${table}" is not a record table` }] };
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return { ok: false, issues: [{ path: '', message: 'must be an object' }] };
  const record = value as Record<string, unknown>;
  const issues: ValidationIssue[] = [];
  let candidate: Record<string, unknown> = { ...record };
  const sealing = WIRE_SEALED_FIELDS[table];
  if (sealing) {
    for (const f of sealing.clear) if (f in record) issues.push({ path: f, message: 'must not travel in clear: seal it under the team key' });
    const sealed = record[sealing.sealed];
    if (!(sealing.nullable && sealed === null)) {
      const check = v.safeParse(SealedSchema, sealed);
      if (!check.success) issues.push(...check.issues.map((i) => ({ path: [sealing.sealed, v.getDotPath(i)].filter(Boolean).join('.'), message: i.message })));
    }
    const { [sealing.sealed]: _sealed, ...rest } = candidate;
    candidate =
      table === 'identities' ? { ...rest, familyName: 'sealed', givenName: 'sealed', dateOfBirth: null, contact: null } : { ...rest, notes: sealed === null ? null : 'sealed' };
  }
  if (table === 'traces' && Array.isArray(record.channels)) {
    candidate.channels = (record.channels as unknown[]).map((c, i) => {
      const channel = c as { encoding?: unknown; samples?: unknown } | null;
      if (typeof channel !== 'object' || channel === null) return c;
      const { encoding, samples, ...rest } = channel;
      if (encoding !== 'float64le-base64' || typeof samples !== 'string') {
        issues.push({ path: `channels.${i}`, message: 'samples must be float64le-base64' });
        return c;
      }
      try {
        return { ...rest, samples: base64ToFloat64(samples) };
      } catch (error) {
        issues.push({ path: `channels.${i}.samples`, message: (error as Error).message });
        return c;
      }
    });
  }
  if (issues.length === 0) {
    const result = validateRecord(table, candidate);
    if (!result.ok) issues.push(...result.issues);
  }
  if (issues.length > 0) return { ok: false, issues };
  return { ok: true, table, record: record as WireRecord };
}
