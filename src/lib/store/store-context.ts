import type { Dexie } from 'dexie';
import type { AuditAction, AuditEntry, TableName } from '../domain';
import type { Codecs } from './codecs';
import { StoreError } from './store-error';
import type { Vault } from './vault';

/** Who is writing: the device and the clinician stamped on every record and audit entry. */
export interface Actor {
  readonly deviceId: string;
  readonly clinicianId: string;
}

/** What repositories share: the database, the vault, the clock, the id source and the actor. */
export interface StoreContext {
  readonly db: Dexie;
  readonly vault: Vault;
  readonly codecs: Codecs;
  readonly now: () => number;
  readonly newId: () => string;
  /** `count` ids after every id drawn so far, from one clock reading (the bulk path). */
  readonly newIds: (count: number) => string[];
  readonly actor: () => Actor | null;
}

export function requireActor(ctx: StoreContext): Actor {
  const actor = ctx.actor();
  if (!actor) throw new StoreError('ValidationFailed', 'no device and clinician set: call ensureActor or setActor first');
  return actor;
}

/** An ISO timestamp for now, strictly after `after` when given, so updatedAt always moves forward. */
export function nextTimestamp(ctx: StoreContext, after?: string): string {
  let ms = Math.floor(ctx.now());
  if (after !== undefined) ms = Math.max(ms, Date.parse(after) + 1);
  return new Date(ms).toISOString();
}

/** Builds an audit entry (not yet written). */
export function auditEntry(
  ctx: StoreContext,
  at: string,
  action: AuditAction,
  table: TableName | '*',
  recordId: string | null,
  before: Record<string, unknown> | null,
  after: Record<string, unknown> | null,
  note: string | null = null,
): AuditEntry {
  const actor = requireActor(ctx);
  return {
    id: ctx.newId(),
    createdAt: at,
    updatedAt: at,
    deviceId: actor.deviceId,
    clinicianId: actor.clinicianId,
    deleted: false,
    action,
    table,
    recordId,
    before,
    after,
    note,
  };
}
