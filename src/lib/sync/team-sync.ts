import { MAX_CLOCK_SKEW_MS, TABLE_NAMES, type AuditEntry, type RecordBase, type TableName } from '../domain';
import {
  BUNDLE_FORMAT,
  BUNDLE_FORMAT_VERSION,
  LATEST_SCHEMA_VERSION,
  TEAM_BASES_TABLE,
  base64ToBytes,
  bytesToBase64,
  createBundle,
  importBackup,
  moveStampsAheadOfTeamTime,
  rowsChangedSince,
  readLocalState,
  tableRows,
  writeLocalState,
  type BundleTables,
  type KinnoteStore,
  type MergeConflict,
} from '../store';
import { parseEnrolmentCode, newEnrolmentCode, formatEnrolmentCode } from './enrolment-code';
import { importTeamKey, newTeamKey, unwrapTeamKey, wrapTeamKey, type TeamKey } from './team-key';
import { OFFSET_TOLERANCE_MS, SERVER_TIME_HEADER, measureOffset } from './clock-offset';
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
  /** Why `serverUrl` cannot be reached when it is not the network (the page's security policy), else null. */
  readonly explainUnreachable?: (serverUrl: string) => string | null;
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
  await store.db.table(TEAM_BASES_TABLE).clear();
}

/** A record's key in the bases table. */
const baseKey = (table: TableName, id: string) => `${table}/${id}`;

/** The bases (updatedAt of the server's copy last known here) of `keys`. */
async function readBases(store: KinnoteStore, keys: readonly string[]): Promise<Map<string, string>> {
  const rows = (await store.db.table(TEAM_BASES_TABLE).bulkGet([...keys])) as ({ key: string; updatedAt: string } | undefined)[];
  return new Map(rows.filter((r) => r !== undefined).map((r) => [r.key, r.updatedAt]));
}

async function writeBases(store: KinnoteStore, bases: readonly { key: string; updatedAt: string }[]): Promise<void> {
  if (bases.length > 0) await store.db.table(TEAM_BASES_TABLE).bulkPut([...bases]);
}

/** The device's clock and the offset from the server's last measured on one exchange (team time = device + offset). */
interface ClockProbe {
  readonly device: () => number;
  offset: number | null;
}

async function api(deps: SyncDeps, serverUrl: string, token: string | null, method: string, path: string, body?: unknown, probe?: ClockProbe): Promise<Record<string, unknown>> {
  let response: Response;
  const sentMs = probe?.device() ?? 0;
  try {
    response = await deps.fetch(`${serverUrl.replace(/\/+$/, '')}${path}`, {
      method,
      headers: { 'content-type': 'application/json', ...(token ? { authorization: `Bearer ${token}` } : {}) },
      ...(body === undefined ? {} : { body: JSON.stringify(body) }),
    });
  } catch (cause) {
    throw new TeamSyncError(deps.explainUnreachable?.(serverUrl) ?? `the team server at ${serverUrl} cannot be reached (offline?)`, null, { cause });
  }
  if (probe) probe.offset = measureOffset(response.headers.get(SERVER_TIME_HEADER), sentMs, probe.device()) ?? probe.offset;
  const json = (await response.json().catch(() => ({}))) as Record<string, unknown>;
  if (!response.ok) throw new TeamSyncError(`team server: ${typeof json.error === 'string' ? json.error : `HTTP ${response.status}`}`, response.status);
  return json;
}

/** Stamps by the team server's clock from now on, when the measured offset moved beyond the noise. */
async function followServerClock(store: KinnoteStore, probe: ClockProbe): Promise<void> {
  if (probe.offset !== null && Math.abs(probe.offset - store.clock.offsetMs) > OFFSET_TOLERANCE_MS) await store.clock.setOffset(probe.offset);
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
  const probe: ClockProbe = { device: store.clock.device, offset: null };
  const enrolled = await api(deps, input.serverUrl, null, 'POST', '/v1/enrol', { auth: code.auth, label: input.label }, probe);
  await followServerClock(store, probe);
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

export interface TeamDevice {
  readonly id: string;
  readonly role: TeamRole;
  readonly label: string;
  readonly createdAt: string;
  readonly lastSeenAt: string | null;
  readonly revoked: boolean;
}

/** The team's devices (admin devices only), oldest first. */
export async function listTeamDevices(store: KinnoteStore, deps: SyncDeps): Promise<TeamDevice[]> {
  const link = await readTeamLink(store);
  if (!link) throw new TeamSyncError('this device has not joined a team', null);
  return (await api(deps, link.serverUrl, link.token, 'GET', '/v1/devices')).devices as TeamDevice[];
}

/** Revokes a team device's token (admin devices only): its next exchange is refused; its own data stays on it. */
export async function revokeTeamDevice(store: KinnoteStore, deviceId: string, deps: SyncDeps): Promise<void> {
  const link = await readTeamLink(store);
  if (!link) throw new TeamSyncError('this device has not joined a team', null);
  await api(deps, link.serverUrl, link.token, 'POST', `/v1/devices/${encodeURIComponent(deviceId)}/revoke`);
}

/** True for the refusal a revoked device gets (401 naming the revocation). */
export function isRevoked(error: unknown): boolean {
  return error instanceof TeamSyncError && error.status === 401 && /revoked/.test(error.message);
}

/**
 * The rows this device has to push, table by table, and the newest stamp scanned (the next mark).
 * The scan starts MAX_CLOCK_SKEW_MS before the mark: the mark is the newest stamp seen at the last
 * push, and pulled records may carry a teammate's clock up to that much ahead of ours, so a record
 * written here after the mark was set can still be stamped below it. Rows still at their base (the
 * server has this very version, e.g. pulled from it) are left out.
 */
async function pendingRows(store: KinnoteStore, mark: string): Promise<{ rows: { table: TableName; row: RecordBase; base: string | null }[]; newest: string }> {
  const from = mark === '' ? '' : new Date(Date.parse(mark) - MAX_CLOCK_SKEW_MS).toISOString();
  const out: { table: TableName; row: RecordBase; base: string | null }[] = [];
  let newest = mark;
  for (const table of TABLE_NAMES) {
    const rows = (await rowsChangedSince(store, table, from).toArray()) as RecordBase[];
    const bases = await readBases(store, rows.map((r) => baseKey(table, r.id)));
    for (const row of rows) {
      if (row.updatedAt > newest) newest = row.updatedAt;
      const base = bases.get(baseKey(table, row.id)) ?? null;
      if (base !== row.updatedAt) out.push({ table, row, base });
    }
  }
  return { rows: out, newest };
}

/**
 * A device that synced before schema 14 has an empty bases table: without bases, its first sync after
 * the upgrade would list every record a teammate changed since, and each of its own edits of pulled
 * records, as conflicts once more. Runs once, on the first sync that finds the table empty after
 * earlier syncs, and gives a base to each version the server held for certain:
 * - a row not changed on this device since the last push: written by another device (it came from
 *   the team, or from a file), or stamped at or before the last push mark (pushed or pulled then);
 * - a row changed here since: the version its first change started from (the `before` of its audit
 *   entry), under the same test.
 * Anything else gets no base and is listed as before. (A record imported here from a backup file
 * after the last sync, written by another device, would count as the server's and not be pushed: it
 * was not pushed before either unless stamped after the mark; noted in DEVELOPERS.md.)
 */
async function seedBasesAfterUpgrade(store: KinnoteStore, link: TeamLink): Promise<void> {
  const own = store.actor?.deviceId;
  if (!own || link.cursor === 0 || (await store.db.table(TEAM_BASES_TABLE).count()) > 0) return;
  const fromServer = (version: { deviceId?: unknown; updatedAt?: unknown }) =>
    typeof version.updatedAt === 'string' && (version.deviceId !== own || version.updatedAt <= link.pushedThrough);
  const audit = store.db.table('audit');
  for (const table of TABLE_NAMES) {
    const rows = await tableRows(store.db, table).all();
    const bases: { key: string; updatedAt: string }[] = [];
    for (const row of rows) {
      let version: { deviceId?: unknown; updatedAt?: unknown } = row;
      if (table !== 'audit' && !fromServer(row)) {
        const changes = (await audit.where('[table+recordId]').equals([table, row.id]).toArray()) as AuditEntry[];
        const first = changes.filter((e) => e.deviceId === own && e.createdAt > link.pushedThrough && e.before !== null).sort((x, y) => (x.createdAt < y.createdAt ? -1 : 1))[0];
        if (first) version = first.before as { deviceId?: unknown; updatedAt?: unknown };
      }
      if (fromServer(version)) bases.push({ key: baseKey(table, row.id), updatedAt: version.updatedAt as string });
    }
    await writeBases(store, bases);
  }
}

/** How many local records wait for the next push (the Team section's quiet status; audit entries not counted). */
export async function countWaiting(store: KinnoteStore, link: TeamLink): Promise<number> {
  return (await pendingRows(store, link.pushedThrough)).rows.filter((r) => r.table !== 'audit').length;
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
  // First the time: records pulled below are checked against the team's clock, and edits from here on
  // are stamped by it. Records already stamped by a fast clock are moved onto it below (stamps-ahead.ts).
  const probe: ClockProbe = { device: store.clock.device, offset: null };
  await api(deps, link.serverUrl, link.token, 'GET', '/v1/me', undefined, probe);
  await followServerClock(store, probe);
  await seedBasesAfterUpgrade(store, link);
  let pushed = 0;
  if (link.role !== 'auditor' && key) {
    // Records stamped by a clock that ran fast before this device knew the team's time would be
    // refused by the server on every push (stopping the sync): moved onto team time, audited.
    await moveStampsAheadOfTeamTime(store);
    const pending = await pendingRows(store, link.pushedThrough);
    const changed = await Promise.all(
      pending.rows.map(async ({ table, row, base }) => ({ table, base, record: (await store.context.codecs[table].fromRow(row as never)) as RecordBase })),
    );
    for (let i = 0; i < changed.length; i += PUSH_BATCH) {
      const batch = changed.slice(i, i + PUSH_BATCH);
      const records = await Promise.all(batch.map(async ({ table, record, base }) => ({ table, record: await toWire(table, record as never, key, deps.randomBytes), base })));
      await api(deps, link.serverUrl, link.token, 'POST', '/v1/push', { records });
      // The server has seen these versions: taken, or compared and listed as a conflict it settled
      // (kept its own). Either way they are its base now, so the pull that brings the server's copy
      // replaces them without listing the same conflict a second time on this device.
      await writeBases(store, batch.map(({ table, record }) => ({ key: baseKey(table, record.id), updatedAt: record.updatedAt })));
      pushed += batch.length;
    }
    link = { ...link, pushedThrough: pending.newest };
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
      const keys = records.filter(({ table }) => table !== 'identities' || key).map(({ table, record }) => baseKey(table, record.id));
      const report = await importBackup(store, bundle, { syncBases: await readBases(store, keys) });
      conflicts.push(...report.conflicts.filter((c) => !c.alreadyRecorded));
      await writeBases(
        store,
        records.filter(({ table }) => table !== 'identities' || key).map(({ table, record }) => ({ key: baseKey(table, record.id), updatedAt: record.updatedAt })),
      );
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
