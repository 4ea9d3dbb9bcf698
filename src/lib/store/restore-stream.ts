import { TABLE_NAMES, referencedIds, type HomeProgramme, type TableName } from '../domain';
import { checkBundleRecord, emptyTables, verifyBundle, type BundleHeader } from './backup-bundle';
import { verifyBundlePhotos } from './backup-photos';
import { canonicalJson } from './canonical-json';
import type { OutsideLookup } from './check-references';
import { sha256Hex } from './crypto-box';
import { BackupCutter } from './restore-stream-cut';
import { StoreError, describeIssues, type StoreIssue } from './store-error';

export interface StreamCheckProgress {
  /** Characters read so far. */
  readonly read: number;
  /** Records checked so far. */
  readonly records: number;
}

export interface VerifyStreamOptions {
  /** The reading device's clock (ms since 1970): stamps later than this plus 10 minutes are refused. */
  readonly now?: () => number;
  /** Where references the file does not resolve may point (the store restored into); none: the file must be self-contained. */
  readonly outside?: OutsideLookup;
  readonly signal?: AbortSignal;
  readonly onProgress?: (progress: StreamCheckProgress) => void | Promise<void>;
}

/** What the first pass of a streamed restore learnt: the file is sound, and which ids it holds. */
export interface CheckedStream {
  readonly header: BundleHeader;
  readonly checksum: string;
  /** The ids of each table, in file order (ids only: the records are read again to be written). */
  readonly ids: ReadonlyMap<TableName, readonly string[]>;
  readonly records: number;
}

/** Issues kept before giving up (a file with thousands of bad records is refused naming the first ones). */
const MAX_ISSUES = 50;

/**
 * Pass 1 of the streamed restore (DEVELOPERS.md, "Streamed backup"): reads a backup's text in pieces
 * and checks all of it before anything is written, keeping only ids. The checks are the whole-file
 * import's own: the envelope and format version (verifyBundle on the header), every record with
 * checkBundleRecord (schema, catalogue, stamps, protected text), duplicate ids, references (in the
 * file or, through `outside`, in the store), the photos against the file's programmes, and the
 * checksum over the body (hashed as it arrives). A bad file is refused as StoreError naming table,
 * row, id and field; cancel gives Aborted. Reads only the exporter's canonical form of a whole-store
 * backup (a one-patient backup is small: the ordinary import reads it).
 */
export async function verifyBackupStream(chunks: AsyncIterable<string>, options: VerifyStreamOptions = {}): Promise<CheckedStream> {
  const nowMs = (options.now ?? Date.now)();
  const cutter = new BackupCutter();
  const headerMembers: string[] = [];
  let header: (BundleHeader & { photos?: unknown }) | null = null;
  const issues: StoreIssue[] = [];
  const ids = new Map<TableName, string[]>(TABLE_NAMES.map((t) => [t, []]));
  const seen = new Map<TableName, Set<string>>(TABLE_NAMES.map((t) => [t, new Set<string>()]));
  /** Referenced ids by target table, each with the first place that names it. */
  const references = new Map<TableName, Map<string, { where: string; field: string }>>(TABLE_NAMES.map((t) => [t, new Map()]));
  const programmes: HomeProgramme[] = [];
  let read = 0;
  let records = 0;
  for await (const chunk of chunks) {
    if (options.signal?.aborted) throw new StoreError('Aborted', 'restore cancelled while the file was being checked; nothing was written');
    read += chunk.length;
    for (const piece of cutter.push(chunk)) {
      if (piece.kind === 'header') {
        headerMembers.push(piece.text);
        continue;
      }
      header ??= await checkHeader(headerMembers, nowMs);
      const table = piece.table as TableName;
      if (!ids.has(table)) throw new StoreError('InvalidBundle', `invalid backup, nothing imported: tables.${piece.table} is not a table this app knows`);
      const record = checkBundleRecord(table, parseRecord(piece.text, table, piece.index), piece.index, { nowMs, scope: header.scope, omitted: header.protectedContent === 'omitted' }, issues);
      records++;
      if (record !== null) {
        const where = `tables.${table}[${piece.index}] (${record.id})`;
        if (seen.get(table)!.has(record.id)) issues.push({ record: where, path: 'id', message: 'appears twice in this table' });
        seen.get(table)!.add(record.id);
        ids.get(table)!.push(record.id);
        if (table === 'homeProgrammes') programmes.push(record as HomeProgramme);
        for (const ref of referencedIds(table, record as unknown as Record<string, unknown>, TABLE_NAMES)) {
          if (ref.target === 'identities' && header.protectedContent === 'omitted') continue;
          const named = references.get(ref.target)!;
          if (!named.has(ref.id)) named.set(ref.id, { where, field: ref.field });
        }
      }
      if (issues.length >= MAX_ISSUES) refuse(issues);
    }
    await options.onProgress?.({ read, records });
  }
  const computed = cutter.finish();
  header ??= await checkHeader(headerMembers, nowMs);
  if (computed !== cutter.statedChecksum) throw new StoreError('TamperedBundle', 'the backup does not match its checksum: it was altered or damaged, so nothing was imported');
  issues.push(...verifyBundlePhotos(header.photos, programmes).issues);
  if (issues.length > 0) refuse(issues);
  await checkReferencesById(references, seen, options.outside ?? null);
  const { photos: _photos, ...plainHeader } = header;
  return { header: plainHeader, checksum: computed, ids, records };
}

function refuse(issues: StoreIssue[]): never {
  throw new StoreError('InvalidBundle', `invalid backup, nothing imported: ${describeIssues(issues)}`, { issues });
}

function parseRecord(text: string, table: string, index: number): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch (cause) {
    throw new StoreError('InvalidBundle', `invalid backup, nothing imported: tables.${table}[${index}] is not valid JSON (${(cause as Error).message})`, { cause });
  }
}

/**
 * The header members (everything before "tables") checked by the whole-file verification itself:
 * verifyBundle on the header with empty tables and no photos (photos are checked at the end, against
 * the file's programmes), so format, version and envelope are refused with the import's own words.
 */
async function checkHeader(members: readonly string[], nowMs: number): Promise<BundleHeader & { photos?: unknown }> {
  let parsed: Record<string, unknown>;
  try {
    parsed = JSON.parse(`{${members.join(',')}}`) as Record<string, unknown>;
  } catch (cause) {
    throw new StoreError('InvalidBundle', `the backup's header is not valid JSON (${(cause as Error).message})`, { cause });
  }
  const { photos, ...rest } = parsed;
  const body = { ...rest, tables: emptyTables() };
  const checked = await verifyBundle({ ...body, checksum: { algorithm: 'SHA-256', value: await sha256Hex(canonicalJson(body)) } }, nowMs);
  if (checked.header.scope.kind !== 'all') throw new StoreError('InvalidBundle', `a one-patient backup (patient ${checked.header.scope.patientId}) is imported whole, not restored in pieces`);
  return { ...checked.header, photos };
}

/** Every referenced id resolves in the file or, through `outside`, in the store (checkReferences' rule, on ids only). */
async function checkReferencesById(
  references: ReadonlyMap<TableName, ReadonlyMap<string, { where: string; field: string }>>,
  inFile: ReadonlyMap<TableName, ReadonlySet<string>>,
  outside: OutsideLookup | null,
): Promise<void> {
  const issues: StoreIssue[] = [];
  for (const [target, named] of references) {
    const missing = [...named.keys()].filter((id) => !inFile.get(target)!.has(id));
    if (missing.length === 0) continue;
    const found = outside ? await outside(target, missing) : new Set<string>();
    for (const id of missing) {
      if (found.has(id)) continue;
      const at = named.get(id)!;
      issues.push({ record: at.where, path: at.field, message: `refers to ${target} ${id}, which is neither in this backup nor on this device` });
      if (issues.length >= MAX_ISSUES) break;
    }
  }
  if (issues.length > 0) refuse(issues);
}
