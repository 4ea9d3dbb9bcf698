import * as v from 'valibot';
import { PROTECTED_TEXT_FIELDS, TABLE_NAMES, checkTimestamps, validateObservation, validateRecord, type ExercisePhoto, type RecordTables, type TableName } from '../domain';
import { base64ToFloat64, float64ToBase64 } from './base64';
import { sortPhotos, toPortablePhoto, verifyBundlePhotos, type PortablePhoto } from './backup-photos';
import { canonicalJson } from './canonical-json';
import { sha256Hex, sha256HexOfBraceAndSlice } from './crypto-box';
import type { Actor } from './store-context';
import { StoreError, describeIssues, type StoreIssue } from './store-error';

export const BUNDLE_FORMAT = 'kinnote-backup';
export const BUNDLE_FORMAT_VERSION = 1;

/** Records in clear, by table: what a bundle carries, and what the demo generator produces. */
export type BundleTables = { [K in TableName]: RecordTables[K][] };

export type BundleScope = { readonly kind: 'all' } | { readonly kind: 'patient'; readonly patientId: string };

/**
 * A backup: versioned JSON with every record of the scope in clear domain form (tombstones
 * included, so deletions merge), trace samples as base64 of float64 little-endian, and a SHA-256
 * checksum over the canonical serialisation of everything else. `protectedContent: 'omitted'`
 * means identities and notes were left out (they are then neither shown nor overwritten on import).
 */
export interface BackupBundle {
  readonly format: typeof BUNDLE_FORMAT;
  readonly formatVersion: number;
  readonly schemaVersion: number;
  readonly exportedAt: string;
  readonly exportedBy: Actor | null;
  readonly source: string;
  readonly scope: BundleScope;
  readonly protectedContent: 'included' | 'omitted';
  readonly tables: { readonly [K in TableName]: readonly Record<string, unknown>[] };
  /** The exercise photos of the bundle's programmes (backup-photos.ts); absent in bundles made before photos were backed up. */
  readonly photos?: readonly PortablePhoto[];
  readonly checksum: { readonly algorithm: 'SHA-256'; readonly value: string };
}

export type BundleHeader = Omit<BackupBundle, 'tables' | 'checksum' | 'photos'>;

/** A bundle that passed every check, with its records decoded to domain form. */
export interface VerifiedBundle {
  readonly header: BundleHeader;
  readonly checksum: string;
  readonly tables: BundleTables;
  /** The photos, decoded and checked; null when the bundle carries none (made before photos were backed up). */
  readonly photos: readonly ExercisePhoto[] | null;
}

export function emptyTables(): BundleTables {
  return Object.fromEntries(TABLE_NAMES.map((t) => [t, []])) as unknown as BundleTables;
}

/**
 * Domain record → bundle form (trace samples to base64). An audit entry loses `importedBy`: that
 * is the importing device's own note, never carried to another device nor compared in a merge.
 */
export function toPortable(table: TableName, record: object): Record<string, unknown> {
  if (table === 'audit' && 'importedBy' in record) {
    const { importedBy: _local, ...rest } = record as Record<string, unknown>;
    return rest;
  }
  if (table !== 'traces') return record as Record<string, unknown>;
  const trace = record as RecordTables['traces'];
  return {
    ...trace,
    channels: trace.channels.map((c) => ({ name: c.name, unit: c.unit, encoding: 'float64le-base64', samples: float64ToBase64(c.samples) })),
  };
}

/** Bundle form → candidate domain record (not yet validated). Throws RangeError naming the channel on bad samples. */
export function fromPortable(table: TableName, portable: unknown): unknown {
  if (table !== 'traces' || typeof portable !== 'object' || portable === null) return portable;
  const channels = (portable as { channels?: unknown }).channels;
  if (!Array.isArray(channels)) return portable;
  return {
    ...portable,
    channels: channels.map((c: unknown, i) => {
      if (typeof c !== 'object' || c === null) return c;
      const { encoding, samples, ...rest } = c as { encoding?: unknown; samples?: unknown };
      if (encoding !== 'float64le-base64') throw new RangeError(`channels.${i}.encoding: must be "float64le-base64"`);
      if (typeof samples !== 'string') throw new RangeError(`channels.${i}.samples: must be a base64 string`);
      try {
        return { ...rest, samples: base64ToFloat64(samples) };
      } catch (error) {
        throw new RangeError(`channels.${i}.samples: ${(error as Error).message}`, { cause: error });
      }
    }),
  };
}

const byId = (a: { id: string }, b: { id: string }) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);

/**
 * Builds a bundle from records in clear: sorts each table by id (so the same records always give
 * the same bytes), encodes traces and computes the checksum. Cost: one canonical serialisation and
 * one SHA-256 over it.
 */
export async function createBundle(tables: Partial<BundleTables>, header: BundleHeader, photos?: readonly ExercisePhoto[]): Promise<BackupBundle> {
  const portable: Record<string, Record<string, unknown>[]> = {};
  for (const table of TABLE_NAMES) {
    const records = [...((tables[table] ?? []) as { id: string }[])].sort(byId);
    portable[table] = records.map((r) => toPortable(table, r));
  }
  const body = { ...header, tables: portable as unknown as BackupBundle['tables'], ...(photos ? { photos: sortPhotos(photos).map(toPortablePhoto) } : {}) };
  const value = await sha256Hex(canonicalJson(body));
  return { ...body, checksum: { algorithm: 'SHA-256', value } };
}

/** The bundle as text: canonical JSON (sorted keys, no whitespace) and a final newline. */
export function serializeBundle(bundle: BackupBundle): string {
  return `${canonicalJson(bundle)}\n`;
}

const EnvelopeSchema = v.object({
  format: v.literal(BUNDLE_FORMAT),
  formatVersion: v.literal(BUNDLE_FORMAT_VERSION),
  schemaVersion: v.pipe(v.number(), v.integer(), v.minValue(1)),
  exportedAt: v.string(),
  exportedBy: v.nullable(v.object({ deviceId: v.string(), clinicianId: v.string() })),
  source: v.string(),
  scope: v.variant('kind', [v.object({ kind: v.literal('all') }), v.object({ kind: v.literal('patient'), patientId: v.string() })]),
  protectedContent: v.picklist(['included', 'omitted']),
  tables: v.object(Object.fromEntries(TABLE_NAMES.map((t) => [t, v.array(v.unknown())])) as Record<TableName, v.ArraySchema<v.UnknownSchema, undefined>>),
  photos: v.optional(v.array(v.unknown())),
  checksum: v.object({ algorithm: v.literal('SHA-256'), value: v.pipe(v.string(), v.regex(/^[0-9a-f]{64}$/)) }),
});

/**
 * Checks a parsed bundle completely before anything is written: format and version (else
 * UnsupportedBundle), envelope (InvalidBundle), checksum (TamperedBundle), then every record
 * against its schema and the measure catalogue, its stamps against `nowMs` (checkTimestamps: no
 * later than the clock plus 10 minutes, no earlier than 2000), duplicate ids, the bundle's scope
 * (a one-patient bundle holds that patient's records only) and protected text where the bundle
 * says it was omitted (InvalidBundle, with issues naming table, index, id and field). Never returns
 * a partly valid bundle. References between records are checked by checkReferences.
 *
 * `sourceText`, the text `parsed` came from, saves serialising the body again when the file is
 * exactly what serializeBundle writes (checksummedRangeAsWritten); any other text that parses to a
 * bundle with the right checksum (re-indented, keys reordered) is still accepted, at that cost.
 *
 * The checksum is an integrity check, not an authenticity check: it catches damage, but anyone can
 * recompute it after editing the file. Authenticity comes only from the encrypted form (AES-GCM's
 * tag under a key derived from the passphrase: only someone who knows it could have written the
 * file) or from a signature, which plain bundles do not carry.
 */
export async function verifyBundle(parsed: unknown, nowMs: number, sourceText?: string): Promise<VerifiedBundle> {
  if (typeof parsed !== 'object' || parsed === null || Array.isArray(parsed)) {
    throw new StoreError('InvalidBundle', 'not a Kinnote backup: the file is not a JSON object');
  }
  const raw = parsed as { format?: unknown; formatVersion?: unknown };
  if (raw.format !== BUNDLE_FORMAT) throw new StoreError('InvalidBundle', `not a Kinnote backup: format is ${JSON.stringify(raw.format) ?? 'missing'}`);
  if (raw.formatVersion !== BUNDLE_FORMAT_VERSION) {
    throw new StoreError('UnsupportedBundle', `backup format version ${JSON.stringify(raw.formatVersion)} is not supported (this app reads version ${BUNDLE_FORMAT_VERSION}); update the app`);
  }
  const envelope = v.safeParse(EnvelopeSchema, parsed);
  if (!envelope.success) {
    const issues = envelope.issues.map((i) => ({ record: 'bundle', path: v.getDotPath(i) ?? '', message: i.message }));
    throw new StoreError('InvalidBundle', `invalid backup: ${describeIssues(issues)}`, { issues });
  }
  const { checksum, ...body } = parsed as BackupBundle;
  const asWritten = sourceText === undefined ? null : checksummedRangeAsWritten(sourceText, checksum.value);
  if (asWritten === null || (await sha256HexOfBraceAndSlice(sourceText!, asWritten.from, asWritten.to)) !== checksum.value) {
    let text: string;
    try {
      text = canonicalJson(body);
    } catch (cause) {
      throw new StoreError('InvalidBundle', `invalid backup: ${(cause as Error).message}`, { cause });
    }
    if ((await sha256Hex(text)) !== checksum.value) {
      throw new StoreError('TamperedBundle', 'the backup does not match its checksum: it was altered or damaged, so nothing was imported');
    }
  }

  const issues: StoreIssue[] = [];
  const tables = emptyTables();
  const { tables: _bodyTables, photos: rawPhotos, ...header } = body;
  const omitted = body.protectedContent === 'omitted';
  for (const table of TABLE_NAMES) {
    const seen = new Set<string>();
    const list = body.tables[table];
    for (let i = 0; i < list.length; i++) {
      const record = checkBundleRecord(table, list[i], i, { nowMs, scope: body.scope, omitted }, issues);
      if (record === null) continue;
      if (seen.has(record.id)) issues.push({ record: `tables.${table}[${i}] (${record.id})`, path: 'id', message: 'appears twice in this table' });
      seen.add(record.id);
      (tables[table] as unknown[]).push(record);
    }
  }
  if (body.scope.kind === 'patient') {
    const ids = new Set(TABLE_NAMES.flatMap((t) => (t === 'audit' ? [] : tables[t].map((r) => r.id))));
    tables.audit.forEach((entry, i) => {
      if (entry.recordId === null || !ids.has(entry.recordId)) {
        issues.push({ record: `tables.audit[${i}] (${entry.id})`, path: 'recordId', message: 'a one-patient backup carries only the audit entries of its own records' });
      }
    });
  }
  const photos = verifyBundlePhotos(rawPhotos, tables.homeProgrammes);
  issues.push(...photos.issues);
  if (issues.length > 0) {
    throw new StoreError('InvalidBundle', `invalid backup, nothing imported: ${describeIssues(issues)}`, { issues });
  }
  return { header, checksum: checksum.value, tables, photos: photos.photos };
}

/**
 * One record of a bundle's table checked on its own (the whole-file verification and the streamed
 * restore both use it): bundle form decoded, schema and catalogue, stamps against `nowMs`, the
 * bundle's scope, protected text where the bundle says it was omitted. Issues name table, index, id
 * and field; the record in domain form is returned when it can be kept (stamp, scope and protected-text
 * issues still refuse the bundle through `issues`), null when it could not be read at all.
 * Duplicate ids and references need the other records: the callers check them.
 */
export function checkBundleRecord(
  table: TableName,
  portable: unknown,
  index: number,
  bundle: { readonly nowMs: number; readonly scope: BundleScope; readonly omitted: boolean },
  issues: StoreIssue[],
): RecordTables[TableName] | null {
  const id = typeof (portable as { id?: unknown })?.id === 'string' ? (portable as { id: string }).id : '?';
  const where = `tables.${table}[${index}] (${id})`;
  let candidate: unknown;
  try {
    candidate = fromPortable(table, portable);
  } catch (error) {
    const [path, ...message] = (error as Error).message.split(': ');
    issues.push({ record: where, path: path ?? '', message: message.join(': ') });
    return null;
  }
  // Observations, the bulk of a backup, through the bulk path's hand-written check (the same verdict,
  // issues and record as validateRecord: validate-observation.test.ts compares them).
  const result = table === 'observations' ? (validateObservation(candidate) as ReturnType<typeof validateRecord>) : validateRecord(table, candidate);
  if (!result.ok) {
    for (const issue of result.issues) issues.push({ record: where, ...issue });
    return null;
  }
  for (const issue of checkTimestamps(result.record, bundle.nowMs)) issues.push({ record: where, ...issue });
  for (const issue of scopeIssues(bundle.scope, table, result.record)) issues.push({ record: where, ...issue });
  if (bundle.omitted) {
    if (table === 'identities') issues.push({ record: where, path: '', message: 'identities present although protectedContent is "omitted"' });
    for (const field of PROTECTED_TEXT_FIELDS[table] ?? []) {
      if ((result.record as Record<string, unknown>)[field] !== null) issues.push({ record: where, path: field, message: 'protected text present although protectedContent is "omitted"' });
    }
  }
  return result.record;
}

/**
 * Where the text the checksum covers lies in the file itself, when the file is in the form
 * serializeBundle writes: canonical JSON whose first member (keys sorted) is the checksum, then the
 * body's members, then optional whitespace. The covered text is `{` followed by
 * sourceText[from, to). Null when the text does not start that way.
 *
 * Why hashing the file's own characters is as strong as serialising the parsed body again: the
 * checksum is SHA-256 over canonicalJson(body). If the cut text hashes to it, it is (short of a
 * SHA-256 collision) that very canonical text, so parsing it gives the body the writer hashed; and
 * the parsed bundle is the checksum member plus exactly those members. A file re-indented or edited
 * fails the comparison and is then checked the slow way, by serialising what was parsed. For a
 * 100,000-observation backup this saves a 58 MB serialisation (in Chromium's profile, the
 * canonical serialisation and its encoding were 60 % of the verification).
 */
function checksummedRangeAsWritten(sourceText: string, checksumValue: string): { from: number; to: number } | null {
  const prefix = `{"checksum":{"algorithm":"SHA-256","value":"${checksumValue}"},`;
  if (!sourceText.startsWith(prefix)) return null;
  let end = sourceText.length;
  while (end > prefix.length && ' \t\n\r'.includes(sourceText[end - 1] as string)) end--;
  return { from: prefix.length, to: end };
}

/**
 * What a one-patient scope allows: patients only that patient, patient-scoped records only theirs,
 * no reliability studies (they travel only in whole-store backups). Clinicians and devices travel
 * with any scope (records are stamped with them).
 */
function scopeIssues(scope: BundleScope, table: TableName, record: object): { path: string; message: string }[] {
  if (scope.kind !== 'patient') return [];
  const r = record as { id: string; patientId?: unknown };
  if (table === 'patients' && r.id !== scope.patientId) return [{ path: 'id', message: `another patient in a backup of patient ${scope.patientId} only` }];
  if (table === 'reliabilityStudies') return [{ path: '', message: 'reliability studies travel only in whole-store backups, not in a one-patient backup' }];
  if (typeof r.patientId === 'string' && r.patientId !== scope.patientId) return [{ path: 'patientId', message: `another patient's record in a backup of patient ${scope.patientId} only` }];
  return [];
}
