import { validateObservation, validateRecord, type AuditEntry, type RecordBase, type RecordInput, type RecordTables, type TableName } from '../domain';
import type { Codec } from './codecs';
import { DRAFTS_TABLE, discardDraftInTransaction } from './drafts';
import { batchAuditEntry, BATCH_AUDIT_MIN_RECORDS } from './batch-audit';
import { settleCaseloadSummaries } from './caseload-summaries';
import { observationSeries } from './observation-rows';
import { auditSnapshot, type Row } from './rows';
import { tableRows, type TableRows } from './table-rows';
import { auditEntry, nextTimestamp, requireActor, type StoreContext } from './store-context';
import { StoreError, toStoreError, type StoreIssue } from './store-error';

export type WritableTable = Exclude<TableName, 'audit'>;
/** What a caller supplies to create a record: its own fields, in clear; the store stamps the rest. */
export type Input<K extends WritableTable> = RecordInput<RecordTables[K]>;
export type Patch<K extends WritableTable> = Partial<Input<K>>;

/** The words of every refused stale write, so that the UI and tests name it the same way. */
export const CHANGED_ELSEWHERE = 'changed in another tab or device: reload';

export interface WriteOptions {
  /** A draft (drafts.ts) to remove in the same transaction: the saved form leaves no draft behind. */
  readonly draftId?: string | null;
}
export interface EditOptions extends WriteOptions {
  /**
   * The record's updatedAt when the caller read it. The write is refused (VersionConflict, nothing
   * written) when the record has changed since; checked again inside the write transaction.
   */
  readonly expectedUpdatedAt?: string;
}

const PATIENT_SCOPED: ReadonlySet<TableName> = new Set([
  'identities',
  'events',
  'assessments',
  'observations',
  'traces',
  'homeProgrammes',
  'adherenceEntries',
  'selfReports',
]);

/**
 * The only way records are written. Each write validates the record (schema and measure
 * catalogue), stamps id (UUIDv7), createdAt, updatedAt, deviceId and clinicianId, seals protected
 * text, and appends an audit entry (who, when, what, before, after) in the same IndexedDB
 * transaction: either both land or neither. Deletes are soft (a tombstone) and undoable. Every
 * failure is a StoreError.
 */
export class Repository<K extends WritableTable> {
  constructor(
    protected readonly ctx: StoreContext,
    readonly table: K,
  ) {}

  protected get codec(): Codec<K> {
    return this.ctx.codecs[this.table] as Codec<K>;
  }

  /** This table's rows in IndexedDB, whatever their layout (table-rows.ts). */
  protected get rows(): TableRows<Row<K> & RecordBase> {
    return tableRows(this.ctx.db, this.table);
  }

  /** The row with `id`, tombstoned or not; undefined when there is none. Protected text stays sealed. */
  async get(id: string): Promise<Row<K> | undefined> {
    try {
      return await this.rows.get(id);
    } catch (error) {
      throw toStoreError(error, `reading ${this.table} ${id}`);
    }
  }

  /** All rows, in id (= creation) order; tombstones only when asked. */
  async list(options: { includeDeleted?: boolean } = {}): Promise<Row<K>[]> {
    try {
      const rows = await this.rows.all();
      return options.includeDeleted ? rows : rows.filter((r) => !(r as { deleted: boolean }).deleted);
    } catch (error) {
      throw toStoreError(error, `reading ${this.table}`);
    }
  }

  /** Rows of one patient (patient-scoped tables only), in id order. */
  async byPatient(patientId: string, options: { includeDeleted?: boolean } = {}): Promise<Row<K>[]> {
    if (!PATIENT_SCOPED.has(this.table)) throw new StoreError('ValidationFailed', `${this.table} is not kept per patient`);
    try {
      const rows = await this.rows.ofPatient(patientId);
      return options.includeDeleted ? rows : rows.filter((r) => !(r as { deleted: boolean }).deleted);
    } catch (error) {
      throw toStoreError(error, `reading ${this.table} of patient ${patientId}`);
    }
  }

  /** The record in clear (opens names and notes; throws Locked while the vault is locked and there are any). */
  async open(row: Row<K>): Promise<RecordTables[K]> {
    return this.codec.fromRow(row);
  }

  /** The record with protected text as null, readable while locked (null for identities). */
  redact(row: Row<K>): RecordTables[K] | null {
    return this.codec.redact(row);
  }

  /**
   * Creates one record. Throws ValidationFailed (issues name the fields), Locked, QuotaExceeded,
   * Aborted; VersionConflict when `firstForPatient` is set and the patient already has a live
   * record of this kind (checked inside the write transaction, so two tabs cannot both create it).
   */
  async create(input: Input<K>, options: WriteOptions & { firstForPatient?: boolean } = {}): Promise<Row<K>> {
    const [row] = await this.createMany([input], options);
    return row as Row<K>;
  }

  /**
   * Creates many records in one transaction (the bulk path for imports of measurements and the
   * benchmark): all are validated first, and if any fails nothing is written. The audit entries
   * (one per record, or one batch entry for a large batch: see batch-audit.ts) are written in the
   * same transaction.
   */
  async createMany(inputs: readonly Input<K>[], options: WriteOptions & { firstForPatient?: boolean } = {}): Promise<Row<K>[]> {
    const { rows, audits } = await this.prepareCreate(inputs);
    try {
      await this.ctx.db.transaction('rw', writeTables(this.table, options), async (tx) => {
        if (options.firstForPatient) {
          for (const patientId of new Set(rows.map((r) => (r as { patientId?: string }).patientId))) {
            if (patientId === undefined) throw new StoreError('ValidationFailed', `${this.table} is not kept per patient`);
            const live = (await this.rows.ofPatient(patientId)).filter((r) => !(r as { deleted: boolean }).deleted);
            if (live.length > 0) throw new StoreError('VersionConflict', `${this.table}: ${CHANGED_ELSEWHERE} (patient ${patientId} already has one)`);
          }
        }
        await this.rows.add(rows as (Row<K> & RecordBase)[]);
        await this.ctx.db.table('audit').bulkAdd(audits);
        await discardDraftInTransaction(this.ctx.db, options.draftId);
        await settleCaseloadSummaries(this.ctx.db, tx);
      });
    } catch (error) {
      throw toStoreError(error, `saving ${rows.length} ${this.table}`);
    }
    return rows;
  }

  /**
   * Validates, stamps and seals new records and builds their audit entries without writing
   * anything, so that several tables can be written in one transaction (see saveAssessment).
   * Throws ValidationFailed (issues name the record and field) or Locked.
   */
  async prepareCreate(inputs: readonly Input<K>[]): Promise<{ rows: Row<K>[]; audits: AuditEntry[] }> {
    const actor = requireActor(this.ctx);
    const at = nextTimestamp(this.ctx);
    const ids = this.ctx.newIds(inputs.length);
    // Observations come in thousands (imports of measurements, a team sync): their hand-written
    // check gives the schema's verdict and issues at a fraction of its cost (validate-observation.ts).
    const validate: (value: unknown) => ReturnType<typeof validateRecord<K>> =
      this.table === 'observations' ? (validateObservation as unknown as (value: unknown) => ReturnType<typeof validateRecord<K>>) : (value) => validateRecord(this.table, value);
    const records: RecordTables[K][] = new Array<RecordTables[K]>(inputs.length);
    const issues: StoreIssue[] = [];
    for (let i = 0; i < inputs.length; i++) {
      const candidate = {
        ...inputs[i],
        id: ids[i],
        createdAt: at,
        updatedAt: at,
        deviceId: actor.deviceId,
        clinicianId: actor.clinicianId,
        deleted: false,
      };
      const result = validate(candidate);
      if (result.ok) records[i] = result.record;
      else for (const issue of result.issues) issues.push({ record: `${this.table}[${i}]`, ...issue });
    }
    if (issues.length > 0) throw validationFailed(this.table, issues);
    // Tables without protected text store the record as it is: no sealing, no await per record.
    const codec = this.codec;
    const rows: Row<K>[] = codec.sealedFields.length === 0 ? (records as unknown as Row<K>[]) : [];
    if (codec.sealedFields.length > 0) for (const record of records) rows.push(await codec.toRow(record));
    if (rows.length >= BATCH_AUDIT_MIN_RECORDS) {
      return { rows, audits: [await batchAuditEntry(this.ctx, at, this.table, rows as never)] };
    }
    const audits = rows.map((row) =>
      auditEntry(this.ctx, at, 'create', this.table, (row as { id: string }).id, null, auditSnapshot(this.table, row as never)),
    );
    return { rows, audits };
  }

  /**
   * Changes fields of one record. With `expectedUpdatedAt`, refuses (VersionConflict) when the
   * record changed since the caller read it. Protected text not in the patch is kept as it is
   * (sealed) without needing the vault; identities always need it.
   */
  async update(id: string, patch: Patch<K>, options: EditOptions = {}): Promise<Row<K>> {
    return this.#change(id, 'update', (current) => ({ ...current, ...patch }), options, patch);
  }

  /** Soft-deletes: sets the tombstone, keeps the data, writes a 'delete' audit entry. */
  async remove(id: string, options: EditOptions = {}): Promise<Row<K>> {
    return this.#change(id, 'delete', (current) => ({ ...current, deleted: true }), options, {});
  }

  /** Undoes a soft delete. */
  async restore(id: string, options: EditOptions = {}): Promise<Row<K>> {
    return this.#change(id, 'restore', (current) => ({ ...current, deleted: false }), options, {});
  }

  async #change(
    id: string,
    action: 'update' | 'delete' | 'restore',
    apply: (current: RecordTables[K]) => RecordTables[K],
    options: EditOptions,
    patch: Patch<K>,
  ): Promise<Row<K>> {
    const prepared = await this.#prepareChange(id, action, apply, options, patch, null);
    try {
      await this.ctx.db.transaction('rw', writeTables(this.table, options), async (tx) => {
        await this.writePrepared(prepared);
        await discardDraftInTransaction(this.ctx.db, options.draftId);
        await settleCaseloadSummaries(this.ctx.db, tx);
      });
    } catch (error) {
      throw toStoreError(error, `saving ${this.table} ${id}`);
    }
    return prepared.row;
  }

  /**
   * Validates, stamps and seals a change of one record (an update with `patch`, or a delete) and
   * builds its audit entry (with `note`, e.g. the reason of an amendment) without writing, so that
   * several records change in one transaction (see amendAssessment). Write it with writePrepared
   * inside a transaction over this table and 'audit'. Throws like update().
   */
  async prepareChange(id: string, action: 'update' | 'delete', patch: Patch<K>, options: EditOptions = {}, note: string | null = null): Promise<PreparedChange<K>> {
    const apply = action === 'delete' ? (current: RecordTables[K]) => ({ ...current, deleted: true }) : (current: RecordTables[K]) => ({ ...current, ...patch });
    return this.#prepareChange(id, action, apply, options, action === 'delete' ? {} : patch, note);
  }

  /** Writes a prepared change inside the caller's transaction; VersionConflict when the record moved on. */
  async writePrepared(prepared: PreparedChange<K>): Promise<void> {
    const now = await this.rows.get(prepared.id);
    if (!now || (now as { updatedAt: string }).updatedAt !== prepared.readUpdatedAt) {
      throw new StoreError('VersionConflict', `${this.table} ${prepared.id}: ${CHANGED_ELSEWHERE} (changed while saving)`);
    }
    await this.rows.put([prepared.row as Row<K> & RecordBase]);
    await this.ctx.db.table('audit').add(prepared.audit);
  }

  async #prepareChange(
    id: string,
    action: 'update' | 'delete' | 'restore',
    apply: (current: RecordTables[K]) => RecordTables[K],
    options: EditOptions,
    patch: Patch<K>,
    note: string | null,
  ): Promise<PreparedChange<K>> {
    const expectedUpdatedAt = options.expectedUpdatedAt;
    const actor = requireActor(this.ctx);
    for (const key of ['id', 'createdAt', 'updatedAt', 'deviceId', 'clinicianId', 'deleted']) {
      if (key in patch) throw new StoreError('ValidationFailed', `${this.table} ${id}: ${key} is set by the store`, { issues: [{ record: `${this.table} ${id}`, path: key, message: 'set by the store' }] });
    }
    const current = await this.get(id);
    if (!current) throw new StoreError('NotFound', `${this.table} ${id} not found`);
    const currentUpdatedAt = (current as { updatedAt: string }).updatedAt;
    if (expectedUpdatedAt !== undefined && expectedUpdatedAt !== currentUpdatedAt) {
      throw new StoreError('VersionConflict', `${this.table} ${id}: ${CHANGED_ELSEWHERE} (read ${expectedUpdatedAt}, now ${currentUpdatedAt})`);
    }
    const codec = this.codec;
    const touchesProtected = codec.protectedFields.some((f) => f in patch);
    const redacted = codec.redact(current);
    const base = redacted ?? (await codec.fromRow(current));
    const at = nextTimestamp(this.ctx, currentUpdatedAt);
    const candidate = { ...apply(base), updatedAt: at, deviceId: actor.deviceId, clinicianId: actor.clinicianId };
    const result = validateRecord(this.table, candidate);
    if (!result.ok) {
      throw validationFailed(this.table, result.issues.map((i) => ({ record: `${this.table} ${id}`, ...i })));
    }
    let row = await codec.toRow(result.record);
    if (redacted !== null && !touchesProtected) {
      // Keep the sealed text as it was: the placeholder null must not overwrite it.
      const kept: Record<string, unknown> = { ...row };
      for (const f of codec.sealedFields) kept[f] = (current as Record<string, unknown>)[f];
      row = kept as Row<K>;
    }
    const audit = auditEntry(this.ctx, at, action, this.table, id, auditSnapshot(this.table, current as never), auditSnapshot(this.table, row as never), note);
    return { id, row, audit, readUpdatedAt: currentUpdatedAt };
  }
}

/** A change validated and stamped, with its audit entry, not yet written (see prepareChange). */
export interface PreparedChange<K extends WritableTable> {
  readonly id: string;
  readonly row: Row<K>;
  readonly audit: AuditEntry;
  /** The record's updatedAt when it was read: the write is refused if it moved on. */
  readonly readUpdatedAt: string;
}

/** The tables a write touches; drafts only when one is removed, so writes nest in narrower transactions. */
function writeTables(table: WritableTable, options: WriteOptions): string[] {
  return options.draftId ? [table, 'audit', DRAFTS_TABLE] : [table, 'audit'];
}

function validationFailed(table: TableName, issues: StoreIssue[]): StoreError {
  const first = issues.slice(0, 5).map((i) => `${i.record}${i.path ? ` ${i.path}` : ''}: ${i.message}`).join('; ');
  return new StoreError('ValidationFailed', `invalid ${table}: ${first}${issues.length > 5 ? `; and ${issues.length - 5} more` : ''}`, { issues });
}

/** Observations, with the time-ordered series query charts use. */
export class ObservationRepository extends Repository<'observations'> {
  /**
   * One patient's observations of one measure in time order, from the compound index
   * [patientId+measureCode+takenAt] (one index range read, no join). Tombstones excluded.
   */
  async series(patientId: string, measureCode: string): Promise<Row<'observations'>[]> {
    try {
      const rows = await observationSeries(this.ctx.db, patientId, measureCode);
      return rows.filter((r) => !r.deleted);
    } catch (error) {
      throw toStoreError(error, `reading ${measureCode} of patient ${patientId}`);
    }
  }
}

/** Identities: names in clear only while the vault is unlocked. */
export class IdentityRepository extends Repository<'identities'> {
  /** The patient's identity in clear, or undefined. Throws Locked while the vault is locked. */
  async forPatient(patientId: string): Promise<RecordTables['identities'] | undefined> {
    const rows = await this.byPatient(patientId);
    const row = rows[rows.length - 1];
    return row ? this.open(row) : undefined;
  }
}
