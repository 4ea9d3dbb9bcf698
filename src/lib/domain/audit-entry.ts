import * as v from 'valibot';
import { IdSchema, IsoDateTimeSchema, recordBaseEntries, TextSchema } from './record-base';

export const AUDIT_ACTIONS = [
  'create',
  'update',
  'delete',
  'restore',
  'merge-take-incoming',
  'merge-keep-local',
  'import',
  /** An export that left the device with identifying data (the note says what and why). */
  'export',
] as const;
export type AuditAction = (typeof AUDIT_ACTIONS)[number];

/**
 * Append-only trace of one change: who (clinicianId), where (deviceId), when (createdAt), what
 * (action, table, recordId) and the record before and after. Snapshots never hold protected text:
 * the store replaces it with a marker before writing the entry.
 */
export const AuditEntrySchema = v.strictObject({
  ...recordBaseEntries,
  action: v.picklist(AUDIT_ACTIONS),
  table: v.pipe(v.string(), v.maxLength(40, 'must be a table name')),
  recordId: v.nullable(IdSchema),
  before: v.nullable(v.record(v.string(), v.unknown())),
  after: v.nullable(v.record(v.string(), v.unknown())),
  note: v.nullable(TextSchema(2000)),
  /**
   * Set by the device that imported this entry from a file (never by the file): which device took
   * it in and when. The entry's own deviceId and clinicianId are then the file's claim, not this
   * device's record. Local provenance: left out of backups and of merge comparisons.
   */
  importedBy: v.optional(v.strictObject({ deviceId: IdSchema, importedAt: IsoDateTimeSchema })),
});
export type AuditEntry = v.InferOutput<typeof AuditEntrySchema>;
