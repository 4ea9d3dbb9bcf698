import type { RecordTables, TableName } from '../domain';
import { base64ToFloat64, float64ToBase64 } from '../store';
import { openWithTeamKey, sealWithTeamKey, type TeamKey } from './team-key';
import { WIRE_SEALED_FIELDS, wireAad, type WireRecord } from './wire-record';

/**
 * Domain record (in clear) → wire form: protected fields sealed under the team key, trace samples
 * base64. Sealing is randomised (fresh nonce), so a record is sealed once per version and the same
 * wire text is pushed again on a retry (the caller keeps it), which keeps pushes idempotent.
 */
export async function toWire<K extends TableName>(table: K, record: RecordTables[K], team: TeamKey, randomBytes: (n: number) => Uint8Array): Promise<WireRecord> {
  const sealing = WIRE_SEALED_FIELDS[table];
  let out: Record<string, unknown> = { ...(record as object) };
  if (table === 'traces') {
    const trace = record as RecordTables['traces'];
    out.channels = trace.channels.map((c) => ({ name: c.name, unit: c.unit, encoding: 'float64le-base64', samples: float64ToBase64(c.samples) }));
  }
  if (sealing) {
    const clear: Record<string, unknown> = {};
    for (const f of sealing.clear) {
      clear[f] = out[f];
      delete out[f];
    }
    const empty = sealing.nullable && clear[sealing.clear[0]!] === null;
    const text = table === 'identities' ? JSON.stringify(clear) : (clear.notes as string | null);
    out = { ...out, [sealing.sealed]: empty || text === null ? null : await sealWithTeamKey(team, text, wireAad(table, record.id, sealing.sealed), randomBytes) };
  }
  return out as WireRecord;
}

/**
 * Wire form → domain record. With no team key (an auditor device) notes come back null; an identity
 * cannot be opened without the key and throws. Throws Error naming the record when a seal fails to open.
 */
export async function fromWire<K extends TableName>(table: K, wire: WireRecord, team: TeamKey | null): Promise<RecordTables[K]> {
  const sealing = WIRE_SEALED_FIELDS[table];
  const { [sealing?.sealed ?? '\u0000']: sealed, ...rest } = wire as Record<string, unknown>;
  const out: Record<string, unknown> = { ...rest };
  if (table === 'traces' && Array.isArray(out.channels)) {
    out.channels = (out.channels as { name: string; unit: string; samples: string }[]).map((c) => ({ name: c.name, unit: c.unit, samples: base64ToFloat64(c.samples) }));
  }
  if (!sealing) return out as unknown as RecordTables[K];
  if (sealed === null || sealed === undefined || team === null) {
    if (table === 'identities') throw new Error(`identity ${wire.id}: this device holds no team key to open it`);
    out.notes = null;
    return out as unknown as RecordTables[K];
  }
  let text: string;
  try {
    text = await openWithTeamKey(team, sealed as { iv: string; ct: string }, wireAad(table, wire.id, sealing.sealed));
  } catch (cause) {
    throw new Error(`${table} ${wire.id}: sealed ${sealing.sealed} does not open with this team key`, { cause });
  }
  if (table === 'identities') return { ...out, ...(JSON.parse(text) as object) } as unknown as RecordTables[K];
  return { ...out, notes: text } as unknown as RecordTables[K];
}

