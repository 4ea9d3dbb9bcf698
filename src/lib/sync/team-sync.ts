import { TABLE_NAMES, type RecordBase, type TableName } from '../domain';
import {
  BUNDLE_FORMAT,
  BUNDLE_FORMAT_VERSION,
  LATEST_SCHEMA_VERSION,
  base64ToBytes,
  bytesToBase64,
  createBundle,
  importBackup,
  readLocalState,
  writeLocalState,
  type BundleTables,
  type KinnoteStore,
  type MergeConflict,
} from '../store';
import { parseEnrolmentCode, newEnrolmentCode, formatEnrolmentCode } from './enrolment-code';
import { importTeamKey, newTeamKey, unwrapTeamKey, wrapTeamKey, type TeamKey } from './team-key';
import { fromWire, toWire } from './wire-codec';
import type { WireRecord } from './wire-record';

export type TeamRole = 'clinician' | 'auditor' | 'admin';

/** What this device keeps about its team (device-local state, never in a backup). */
export interface TeamLink {
  readonly serverUrl: string;
  readonly token: string;
  readonly deviceId: string;
  readonly teamId: string;
  readonly teamName: string;
  readonly role: TeamRole;
  /** The team key sealed by this device's vault (null on auditor devices, which never hold it). */
  readonly teamKeySealed: { iv: string; ct: string } | null;
  /** Last change number pulled. */
  readonly cursor: number;
  /** updatedAt of the newest local record already pushed. */
  readonly pushedThrough: string;
  readonly lastSyncedAt: string | null;
  readonly conflictsSeen: number;
  /** Conflicts settled on this device or on the server, newest last (at most 100 kept). */
  readonly conflicts: readonly { table: string; recordId: string; winner: string; reason: string; at: string }[];
}

export interface SyncDeps {
  readonly fetch: typeof fetch;
  readonly randomBytes: (n: number) => Uint8Array;
  readonly now?: () => number;
}

const LINK_KEY = 'local:team-link';
const KEY_AAD = 'kinnote:local:team-key';
const PUSH_BATCH = 200;

export class TeamSyncError extends Error {
  override readonly name = 'TeamSyncError';
  constructor(
    message: string,
    readonly status: number | null,
    options?: { cause?: unknown },
  ) {
    super(message, options);
  }
}

export async function readTeamLink(store: KinnoteStore): Promise<TeamLink | null> {
  return ((await readLocalState(store, LINK_KEY)) as TeamLink | undefined) ?? null;
}

async function saveLink(store: KinnoteStore, link: TeamLink): Promise<void> {
  await writeLocalState(store, LINK_KEY, link);
}

export async function leaveTeam(store: KinnoteStore): Promise<void> {
  await writeLocalState(store, LINK_KEY, null);
}

async function api(deps: SyncDeps, serverUrl: string, token: string | null, method: string, path: string, body?: unknown): Promise<Record<string, unknown>> {
  let response: Response;
  try {
    response = await deps.fetch(`${serverUrl.replace(/\/+$/, '')}${path}`, {
      method,
      headers: { 'content-type': 'application/json', ...(token ? { authorization: `Bearer ${token}` } : {}) },
      ...(body === undefined ? {} : { body: JSON.stringify(body) }),
    });
  } catch (cause) {
    throw new TeamSyncError(`the team server at ${serverUrl} cannot be reached (offline?)`, null, { cause });
  }
  const json = (await response.json().catch(() => ({}))) as Record<string, unknown>;
  if (!response.ok) throw new TeamSyncError(`team server: ${typeof json.error === 'string' ? json.error : `HTTP ${response.status}`}`, response.status);
  return json;
}

async function teamKeyOf(store: KinnoteStore, link: TeamLink): Promise<TeamKey | null> {
  if (link.teamKeySealed === null) return null;
  return importTeamKey(base64ToBytes(await store.vault.open(link.teamKeySealed, KEY_AAD)));
}

/**
 * Joins a team with a server address and an enrolment code. Clinician and admin devices open the
 * team key from the hand-off with the code's key half (the first admin creates the key); the key is
 * kept sealed by this device's vault, so the vault must be unlocked. Auditors get no key.
 */
export async function joinTeam(store: KinnoteStore, input: { serverUrl: string; code: string; label: string }, deps: SyncDeps): Promise<TeamLink> {
  const code = parseEnrolmentCode(input.code);
  const enrolled = await api(deps, input.serverUrl, null, 'POST', '/v1/enrol', { auth: code.auth, label: input.label });
  const role = enrolled.role as TeamRole;
  let key: TeamKey | null = null;
  if (role !== 'auditor') {
    key = typeof enrolled.keyEnvelope === 'string' ? await unwrapTeamKey(enrolled.keyEnvelope, code) : await newTeamKey(deps.randomBytes);
  }
  const link: TeamLink = {
    serverUrl: input.serverUrl.replace(/\/+$/, ''),
    token: enrolled.token as string,
    deviceId: enrolled.deviceId as string,
    teamId: enrolled.teamId as string,
    teamName: enrolled.teamName as string,
    role,
    teamKeySealed: key ? await store.vault.seal(bytesToBase64(key.raw), KEY_AAD) : null,
    cursor: 0,
    pushedThrough: '',
    lastSyncedAt: null,
    conflictsSeen: 0,
    conflicts: [],
  };
  await saveLink(store, link);
  return link;
}

/** An admin device draws a code for a new device; the team key goes inside for clinicians and admins. */
export async function issueEnrolmentCode(store: KinnoteStore, role: TeamRole, ttlMs: number, deps: SyncDeps): Promise<{ code: string; expiresAt: string }> {
  const link = await readTeamLink(store);
  if (!link) throw new TeamSyncError('this device has not joined a team', null);
  const code = newEnrolmentCode(deps.randomBytes);
  const key = role === 'auditor' ? null : await teamKeyOf(store, link);
  const keyEnvelope = key ? await wrapTeamKey(key, code, deps.randomBytes) : null;
  const issued = await api(deps, link.serverUrl, link.token, 'POST', '/v1/codes', { auth: code.auth, role, ttlMs, keyEnvelope });
  return { code: formatEnrolmentCode(code), expiresAt: issued.expiresAt as string };
}

/**
 * The rows of `table` stamped after `mark`: through the table's updatedAt index where it has one
 * (the audit log, append-only, through createdAt, its updatedAt); observations lost that index in
 * schema 5 (each index costs a write per record), so there it is one scan of the table.
 */
export function rowsChangedSince(store: KinnoteStore, table: TableName, mark: string): { toArray(): Promise<unknown[]>; count(): Promise<number> } {
  const t = store.db.table(table);
  const field = table === 'audit' ? 'createdAt' : 'updatedAt';
  if (t.schema.idxByName[field] || t.schema.primKey.name === field) return t.where(field).above(mark);
  return t.filter((row: Record<string, unknown>) => (row[field] as string) > mark);
}

/** Local records changed since the last push, in clear (the vault opens protected text). */
async function changedSince(store: KinnoteStore, mark: string): Promise<{ table: TableName; record: RecordBase }[]> {
  const out: { table: TableName; record: RecordBase }[] = [];
  for (const table of TABLE_NAMES) {
    const rows = (await rowsChangedSince(store, table, mark).toArray()) as RecordBase[];
    const codec = store.context.codecs[table];
    for (const row of rows) out.push({ table, record: (await codec.fromRow(row as never)) as RecordBase });
  }
  return out;
}

export interface SyncReport {
  readonly pushed: number;
  readonly pulled: number;
  readonly conflicts: readonly MergeConflict[];
}

/**
 * One sync: push what changed here (in batches, each all or nothing on the server), then pull pages
 * since the cursor and merge them through the store's backup import (same validation, same rules,
 * conflicts audited). Protected text needs the vault unlocked on clinician and admin devices.
 */
export async function syncNow(store: KinnoteStore, deps: SyncDeps): Promise<SyncReport> {
  let link = await readTeamLink(store);
  if (!link) throw new TeamSyncError('this device has not joined a team', null);
  const key = await teamKeyOf(store, link);
  let pushed = 0;
  if (link.role !== 'auditor' && key) {
    const changed = await changedSince(store, link.pushedThrough);
    let mark = link.pushedThrough;
    for (let i = 0; i < changed.length; i += PUSH_BATCH) {
      const batch = changed.slice(i, i + PUSH_BATCH);
      const records = await Promise.all(batch.map(async ({ table, record }) => ({ table, record: await toWire(table, record as never, key, deps.randomBytes) })));
      await api(deps, link.serverUrl, link.token, 'POST', '/v1/push', { records });
      pushed += batch.length;
    }
    for (const { record } of changed) if (record.updatedAt > mark) mark = record.updatedAt;
    link = { ...link, pushedThrough: mark };
    await saveLink(store, link);
  }
  let pulled = 0;
  const conflicts: MergeConflict[] = [];
  for (;;) {
    const page = await api(deps, link.serverUrl, link.token, 'GET', `/v1/pull?cursor=${link.cursor}&limit=500`);
    const records = page.records as { table: TableName; record: WireRecord }[];
    if (records.length > 0) {
      const tables = Object.fromEntries(TABLE_NAMES.map((t) => [t, [] as unknown[]])) as unknown as BundleTables;
      for (const { table, record } of records) {
        if (table === 'identities' && !key) continue;
        (tables[table] as unknown[]).push(await fromWire(table, record, key));
      }
      const bundle = await createBundle(tables, {
        format: BUNDLE_FORMAT,
        formatVersion: BUNDLE_FORMAT_VERSION,
        schemaVersion: LATEST_SCHEMA_VERSION,
        exportedAt: new Date((deps.now ?? Date.now)()).toISOString(),
        exportedBy: null,
        source: `team server ${link.teamName}`,
        scope: { kind: 'all' },
        protectedContent: key ? 'included' : 'omitted',
      });
      const report = await importBackup(store, bundle);
      conflicts.push(...report.conflicts.filter((c) => !c.alreadyRecorded));
      pulled += records.length;
    }
    link = { ...link, cursor: page.cursor as number };
    if (!page.more) break;
  }
  const server = (await api(deps, link.serverUrl, link.token, 'GET', `/v1/conflicts?since=${link.conflictsSeen}`)).conflicts as { seq: number; table: string; recordId: string; winner: string; reason: string; at: string }[];
  const at = new Date((deps.now ?? Date.now)()).toISOString();
  const listed = [
    ...link.conflicts,
    ...conflicts.map((c) => ({ table: c.table, recordId: c.recordId, winner: c.winner === 'local' ? 'kept on this device' : 'taken from the team', reason: c.reason, at })),
    ...server.map((c) => ({ table: c.table, recordId: c.recordId, winner: c.winner === 'stored' ? 'kept on the server' : 'replaced on the server', reason: c.reason, at: c.at })),
  ].slice(-100);
  link = { ...link, conflicts: listed, conflictsSeen: server.length > 0 ? server[server.length - 1]!.seq : link.conflictsSeen, lastSyncedAt: at };
  await saveLink(store, link);
  return { pushed, pulled, conflicts };
}
