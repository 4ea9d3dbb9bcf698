import { canonicalJson } from '../lib/store';
import { checkWireRecord, type WireRecord } from '../lib/sync';
import { checkTimestamps, type TableName } from '../lib/domain';
import { newDeviceToken, randomBase32, sha256Hex } from './secrets';
import type { SqlClient, SqlQueryable } from './sql-client';

export type Role = 'clinician' | 'auditor' | 'admin';
export const ROLES: readonly Role[] = ['clinician', 'auditor', 'admin'];

/** A refusal the API maps to an HTTP status, with a message that names what is wrong. */
export class TeamServerError extends Error {
  override readonly name = 'TeamServerError';
  constructor(
    readonly status: 400 | 401 | 403 | 404 | 409 | 413 | 429,
    message: string,
    readonly issues?: readonly { record: string; path: string; message: string }[],
  ) {
    super(message);
  }
}

export interface Device {
  readonly id: string;
  readonly teamId: string;
  readonly role: Role;
  readonly label: string;
}

export interface PushResult {
  readonly inserted: number;
  readonly replaced: number;
  readonly unchanged: number;
  readonly keptStored: number;
  /** The team's change number after this push. */
  readonly seq: number;
  readonly conflicts: readonly PushConflict[];
}

export interface PushConflict {
  readonly table: TableName;
  readonly recordId: string;
  readonly winner: 'incoming' | 'stored';
  readonly reason: 'newer' | 'tie-break';
}

export interface PulledRecord {
  readonly seq: number;
  readonly table: TableName;
  readonly record: WireRecord;
}

export const MAX_PUSH_RECORDS = 1000;
export const MAX_PULL_LIMIT = 2000;
const DAY_MS = 86_400_000;

/**
 * Teams, devices and the record log of the team server, on any SqlClient. Every method that touches
 * records takes the authenticated Device and scopes every statement to its team.
 */
export class TeamService {
  constructor(
    private readonly db: SqlClient,
    /** The server's clock: the team's one time line (devices stamp by it, see team-sync.ts). */
    readonly now: () => number = () => Date.now(),
  ) {}

  /** Creates a team and its first admin's one-time code (valid `ttlMs`, default 24 h). */
  async createTeam(name: string, ttlMs = DAY_MS): Promise<{ teamId: string; code: string; expiresAt: string }> {
    const teamName = name.trim();
    if (teamName === '' || teamName.length > 200) throw new TeamServerError(400, 'team name: must be 1 to 200 characters');
    const teamId = crypto.randomUUID();
    // The server draws the whole code; the key half is unused for the first admin, whose device
    // creates the team key, and is forgotten here.
    const auth = randomBase32(10);
    const code = `${auth.slice(0, 5)}-${auth.slice(5)}-${randomBase32(16).match(/.{4}/g)!.join('-')}`;
    const expiresAt = new Date(this.now() + ttlMs).toISOString();
    await this.db.transaction(async (tx) => {
      await tx.query('INSERT INTO teams (id, name) VALUES ($1, $2)', [teamId, teamName]);
      await tx.query('INSERT INTO enrolment_codes (code_hash, team_id, role, key_envelope, expires_at, created_by) VALUES ($1, $2, $3, NULL, $4, NULL)', [
        sha256Hex(auth),
        teamId,
        'admin',
        expiresAt,
      ]);
    });
    return { teamId, code, expiresAt };
  }

  /**
   * An admin registers a code its device drew: the server gets the authenticating half (`auth`, kept
   * as SHA-256) and, for clinicians and admins, the team key wrapped under the other half.
   */
  async issueCode(admin: Device, input: { auth: string; role: Role; ttlMs: number; keyEnvelope: string | null }): Promise<{ expiresAt: string }> {
    requireRole(admin, ['admin']);
    if (!/^[0-9A-HJKMNP-TV-Z]{10}$/.test(input.auth)) throw new TeamServerError(400, 'auth: must be the 10-character first half of an enrolment code');
    if (!ROLES.includes(input.role)) throw new TeamServerError(400, `role: must be one of ${ROLES.join(', ')}`);
    if (!(input.ttlMs >= 60_000 && input.ttlMs <= 7 * DAY_MS)) throw new TeamServerError(400, 'ttlMs: a code lives between 1 minute and 7 days');
    if (input.role === 'auditor' && input.keyEnvelope !== null) throw new TeamServerError(400, 'keyEnvelope: auditor devices never receive the team key');
    if (input.role !== 'auditor' && (typeof input.keyEnvelope !== 'string' || input.keyEnvelope.length > 4000)) {
      throw new TeamServerError(400, 'keyEnvelope: a clinician or admin code carries the wrapped team key');
    }
    const expiresAt = new Date(this.now() + input.ttlMs).toISOString();
    const rows = await this.db.query(
      'INSERT INTO enrolment_codes (code_hash, team_id, role, key_envelope, expires_at, created_by) VALUES ($1, $2, $3, $4, $5, $6) ON CONFLICT DO NOTHING RETURNING code_hash',
      [sha256Hex(input.auth), admin.teamId, input.role, input.keyEnvelope, expiresAt, admin.id],
    );
    if (rows.length === 0) throw new TeamServerError(409, 'auth: this code is already registered; draw a new one');
    return { expiresAt };
  }

  /** Spends a one-time code: a new device with a random token (only its hash is kept). */
  async enrol(auth: string, label: string): Promise<{ deviceId: string; token: string; teamId: string; teamName: string; role: Role; keyEnvelope: string | null }> {
    const name = label.trim();
    if (name === '' || name.length > 120) throw new TeamServerError(400, 'label: must be 1 to 120 characters');
    const token = newDeviceToken();
    const deviceId = crypto.randomUUID();
    return this.db.transaction(async (tx) => {
      // One UPDATE both checks and spends the code, so two devices racing for it cannot both win.
      const spent = await tx.query<{ team_id: string; role: Role; key_envelope: string | null }>(
        'UPDATE enrolment_codes SET used_at = $2 WHERE code_hash = $1 AND used_at IS NULL AND expires_at > $2 RETURNING team_id, role, key_envelope',
        [sha256Hex(auth), new Date(this.now()).toISOString()],
      );
      const code = spent[0];
      if (!code) throw new TeamServerError(401, 'enrolment code: unknown, already used or expired');
      await tx.query('INSERT INTO devices (id, team_id, role, label, token_hash) VALUES ($1, $2, $3, $4, $5)', [deviceId, code.team_id, code.role, name, sha256Hex(token)]);
      const team = await tx.query<{ name: string }>('SELECT name FROM teams WHERE id = $1', [code.team_id]);
      return { deviceId, token, teamId: code.team_id, teamName: team[0]!.name, role: code.role, keyEnvelope: code.key_envelope };
    });
  }

  /** The device a bearer token belongs to; 401 for an unknown or revoked token. */
  async authenticate(token: string): Promise<Device> {
    const rows = await this.db.query<{ id: string; team_id: string; role: Role; label: string; revoked_at: unknown }>(
      'SELECT id, team_id, role, label, revoked_at FROM devices WHERE token_hash = $1',
      [sha256Hex(token)],
    );
    const row = rows[0];
    if (!row) throw new TeamServerError(401, 'unknown device token');
    if (row.revoked_at !== null) throw new TeamServerError(401, 'this device was revoked by a team admin');
    // Last seen, for the admins' list: written at most once a minute per device.
    const at = new Date(this.now());
    await this.db.query('UPDATE devices SET last_seen_at = $2 WHERE id = $1 AND (last_seen_at IS NULL OR last_seen_at < $3)', [row.id, at.toISOString(), new Date(at.getTime() - 60_000).toISOString()]);
    return { id: row.id, teamId: row.team_id, role: row.role, label: row.label };
  }

  async listDevices(admin: Device): Promise<{ id: string; role: Role; label: string; createdAt: string; lastSeenAt: string | null; revoked: boolean }[]> {
    requireRole(admin, ['admin']);
    const rows = await this.db.query<{ id: string; role: Role; label: string; created_at: Date | string; last_seen_at: Date | string | null; revoked_at: unknown }>(
      'SELECT id, role, label, created_at, last_seen_at, revoked_at FROM devices WHERE team_id = $1 ORDER BY created_at, id',
      [admin.teamId],
    );
    return rows.map((r) => ({
      id: r.id,
      role: r.role,
      label: r.label,
      createdAt: new Date(r.created_at).toISOString(),
      lastSeenAt: r.last_seen_at === null ? null : new Date(r.last_seen_at).toISOString(),
      revoked: r.revoked_at !== null,
    }));
  }

  async revoke(admin: Device, deviceId: string): Promise<void> {
    requireRole(admin, ['admin']);
    if (deviceId === admin.id) throw new TeamServerError(400, 'an admin device cannot revoke itself: another admin must, or leave the team on this device');
    const rows = await this.db.query('UPDATE devices SET revoked_at = now() WHERE id = $1 AND team_id = $2 AND revoked_at IS NULL RETURNING id', [deviceId, admin.teamId]);
    if (rows.length === 0) throw new TeamServerError(404, `device ${deviceId}: not an active device of this team`);
  }

  /**
   * Merges a batch into the team's records in one transaction (all or nothing), with the rules of a
   * backup import: absent → inserted; identical → unchanged; otherwise the newer updatedAt wins, equal
   * times go to the larger canonical text, audit entries are never replaced. Each pushed record may
   * carry `base`, the updatedAt of the server's copy its edit started from: a newer record whose base
   * is the stored version is an ordinary edit; anything else that differs is a conflict, recorded once. Each written record takes the next change number of its team: the push first
   * locks the team's counter row, so pushers of one team run one after another and change numbers
   * become visible in increasing order (a pull by number never skips a later commit).
   */
  async push(device: Device, batch: unknown): Promise<PushResult> {
    requireRole(device, ['clinician', 'admin']);
    const records = checkBatch(batch, this.now());
    return this.db.transaction(async (tx) => {
      const locked = await tx.query<{ change_seq: string | number }>('SELECT change_seq FROM teams WHERE id = $1 FOR UPDATE', [device.teamId]);
      let seq = Number(locked[0]!.change_seq);
      const stored = await readStored(tx, device.teamId, records);
      const counts = { inserted: 0, replaced: 0, unchanged: 0, keptStored: 0 };
      const writes: unknown[][] = [];
      const conflicts: PushConflict[] = [];
      const conflictRows: unknown[][] = [];
      for (const { table, record, text, base } of records) {
        const current = stored.get(`${table}/${record.id}`);
        if (current === undefined) {
          counts.inserted++;
          writes.push([table, record.id, record.updatedAt, record.deleted, ++seq, device.id, text]);
          continue;
        }
        // The same version again: same updatedAt from the same writing device. Its text can differ only
        // where it was sealed again with a fresh nonce (a device pushing back what it pulled, or a
        // retried push): nothing changed, and it is no conflict.
        const storedWriter = (JSON.parse(current.body) as { deviceId?: unknown }).deviceId;
        if (current.body === text || (record.updatedAt === current.updated_at && record.deviceId === storedWriter)) {
          counts.unchanged++;
          continue;
        }
        const tie = record.updatedAt === current.updated_at;
        const incomingWins = table !== 'audit' && (tie ? text > current.body : record.updatedAt > current.updated_at);
        const reason = tie ? 'tie-break' : 'newer';
        // An ordinary edit: the pushing device started from the stored version (its base), or the
        // stored version is the same writer's earlier one (a retry after a lost reply). The newer
        // copy replaces it by the same rule, but nobody else's change was overwritten: no conflict.
        if (incomingWins && !tie && (base === current.updated_at || record.deviceId === storedWriter)) {
          counts.replaced++;
          writes.push([table, record.id, record.updatedAt, record.deleted, ++seq, device.id, text]);
          continue;
        }
        conflicts.push({ table, recordId: record.id, winner: incomingWins ? 'incoming' : 'stored', reason });
        if (incomingWins) {
          counts.replaced++;
          writes.push([table, record.id, record.updatedAt, record.deleted, ++seq, device.id, text]);
          conflictRows.push([table, record.id, record.updatedAt, current.updated_at, sha256Hex(current.body), 'incoming', reason, device.id]);
        } else {
          counts.keptStored++;
          conflictRows.push([table, record.id, current.updated_at, record.updatedAt, sha256Hex(text), 'stored', reason, device.id]);
        }
      }
      for (const chunk of chunks(writes, 500)) {
        await tx.query(
          `INSERT INTO records (team_id, tbl, id, updated_at, deleted, seq, device_id, body) VALUES ${values(chunk.length, 7, 2)}
           ON CONFLICT (team_id, tbl, id) DO UPDATE SET updated_at = EXCLUDED.updated_at, deleted = EXCLUDED.deleted, seq = EXCLUDED.seq, device_id = EXCLUDED.device_id, body = EXCLUDED.body`,
          [device.teamId, ...chunk.flat()],
        );
      }
      for (const chunk of chunks(conflictRows, 500)) {
        await tx.query(
          `INSERT INTO conflicts (team_id, tbl, record_id, kept_updated_at, lost_updated_at, lost_hash, winner, reason, device_id) VALUES ${values(chunk.length, 8, 2)}
           ON CONFLICT DO NOTHING`,
          [device.teamId, ...chunk.flat()],
        );
      }
      if (writes.length > 0) await tx.query('UPDATE teams SET change_seq = $2 WHERE id = $1', [device.teamId, seq]);
      return { ...counts, seq, conflicts };
    });
  }

  /**
   * Changes after `cursor` in change-number order, at most `limit`. An auditor's device never
   * receives identities or their audit entries, and notes arrive as null: only pseudonymous codes
   * and measurements.
   */
  async pull(device: Device, cursor: number, limit: number): Promise<{ records: PulledRecord[]; cursor: number; more: boolean }> {
    if (!Number.isSafeInteger(cursor) || cursor < 0) throw new TeamServerError(400, 'cursor: must be a whole number ≥ 0');
    if (!Number.isSafeInteger(limit) || limit < 1 || limit > MAX_PULL_LIMIT) throw new TeamServerError(400, `limit: must be 1 to ${MAX_PULL_LIMIT}`);
    const auditor = device.role === 'auditor';
    const rows = await this.db.query<{ seq: string | number; tbl: TableName; body: string }>(
      // An auditor gets neither identities nor the audit entries about them (which would name records
      // the device can never hold, so its import would refuse the page).
      `SELECT seq, tbl, body FROM records WHERE team_id = $1 AND seq > $2 ${auditor ? "AND tbl <> 'identities' AND NOT (tbl = 'audit' AND body::jsonb ->> 'table' = 'identities')" : ''} ORDER BY seq LIMIT $3`,
      [device.teamId, cursor, limit + 1],
    );
    const more = rows.length > limit;
    const page = rows.slice(0, limit).map((r) => {
      let record = JSON.parse(r.body) as WireRecord;
      if (auditor && 'notesSealed' in record) record = { ...record, notesSealed: null };
      return { seq: Number(r.seq), table: r.tbl, record };
    });
    return { records: page, cursor: page.length > 0 ? page[page.length - 1]!.seq : cursor, more };
  }

  /** Conflicts recorded for the team after `since` (their own numbering), oldest first. */
  async conflicts(device: Device, since: number): Promise<{ seq: number; table: string; recordId: string; winner: string; reason: string; keptUpdatedAt: string; lostUpdatedAt: string; at: string }[]> {
    const rows = await this.db.query<Record<string, unknown>>(
      'SELECT seq, tbl, record_id, winner, reason, kept_updated_at, lost_updated_at, at FROM conflicts WHERE team_id = $1 AND seq > $2 ORDER BY seq LIMIT 1000',
      [device.teamId, since],
    );
    return rows.map((r) => ({
      seq: Number(r.seq),
      table: r.tbl as string,
      recordId: r.record_id as string,
      winner: r.winner as string,
      reason: r.reason as string,
      keptUpdatedAt: r.kept_updated_at as string,
      lostUpdatedAt: r.lost_updated_at as string,
      at: new Date(r.at as string).toISOString(),
    }));
  }
}

function requireRole(device: Device, roles: readonly Role[]): void {
  if (!roles.includes(device.role)) throw new TeamServerError(403, `a ${device.role} device may not do this (needs ${roles.join(' or ')})`);
}

interface CheckedRecord {
  readonly table: TableName;
  readonly record: WireRecord;
  readonly text: string;
  /** The updatedAt of the server's copy the device's edit started from (null: none known, e.g. created there). */
  readonly base: string | null;
}

const ISO_STAMP = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/;

/** Validates a whole batch before anything is written; refuses it whole, naming index, table, id and field. */
function checkBatch(batch: unknown, nowMs: number): CheckedRecord[] {
  const list = (batch as { records?: unknown } | null)?.records;
  if (!Array.isArray(list)) throw new TeamServerError(400, 'body: must be {"records": [{"table": …, "record": …}, …]}');
  if (list.length > MAX_PUSH_RECORDS) throw new TeamServerError(413, `records: at most ${MAX_PUSH_RECORDS} per push, got ${list.length}`);
  const out: CheckedRecord[] = [];
  const issues: { record: string; path: string; message: string }[] = [];
  const seen = new Set<string>();
  list.forEach((item: unknown, i) => {
    const { table, record, base = null } = (item ?? {}) as { table?: unknown; record?: unknown; base?: unknown };
    const id = typeof (record as { id?: unknown } | null)?.id === 'string' ? (record as { id: string }).id : '?';
    const where = `records[${i}] (${String(table)} ${id})`;
    const checked = checkWireRecord(String(table), record);
    if (!checked.ok) {
      for (const issue of checked.issues) issues.push({ record: where, ...issue });
      return;
    }
    // Stamps beyond the server's clock (plus the devices' 10-minute margin) are refused here: once
    // stored, every device's pull would refuse the page that carries them, and the team would stall.
    const stamps = checkTimestamps(checked.record as unknown as { createdAt: string; updatedAt: string }, nowMs);
    for (const issue of stamps) issues.push({ record: where, path: issue.path, message: issue.message.replace("this device's clock", "the team server's clock") });
    if (base !== null && !(typeof base === 'string' && ISO_STAMP.test(base))) issues.push({ record: where, path: 'base', message: 'must be null or the ISO updatedAt the edit started from' });
    const key = `${checked.table}/${checked.record.id}`;
    if (seen.has(key)) issues.push({ record: where, path: 'id', message: 'appears twice in this push' });
    seen.add(key);
    out.push({ table: checked.table, record: checked.record, text: canonicalJson(checked.record), base: typeof base === 'string' ? base : null });
  });
  if (issues.length > 0) {
    const first = issues.slice(0, 3).map((i) => `${i.record} ${i.path}: ${i.message}`).join('; ');
    throw new TeamServerError(400, `push refused, nothing written: ${first}${issues.length > 3 ? ` (and ${issues.length - 3} more)` : ''}`, issues);
  }
  return out;
}

async function readStored(tx: SqlQueryable, teamId: string, records: readonly CheckedRecord[]): Promise<Map<string, { updated_at: string; body: string }>> {
  const found = new Map<string, { updated_at: string; body: string }>();
  const byTable = new Map<string, string[]>();
  for (const r of records) byTable.set(r.table, [...(byTable.get(r.table) ?? []), r.record.id]);
  for (const [table, ids] of byTable) {
    const rows = await tx.query<{ id: string; updated_at: string; body: string }>('SELECT id, updated_at, body FROM records WHERE team_id = $1 AND tbl = $2 AND id = ANY($3)', [
      teamId,
      table,
      ids,
    ]);
    for (const row of rows) found.set(`${table}/${row.id}`, row);
  }
  return found;
}

/** `($2, $3, …), (…)` for `rows` rows of `width` parameters starting at `$first`, each row led by $1. */
function values(rows: number, width: number, first: number): string {
  const out: string[] = [];
  for (let r = 0; r < rows; r++) {
    const params = Array.from({ length: width }, (_, c) => `$${first + r * width + c}`);
    out.push(`($1, ${params.join(', ')})`);
  }
  return out.join(', ');
}

function chunks<T>(list: readonly T[], size: number): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < list.length; i += size) out.push(list.slice(i, i + size));
  return out;
}
