import type { AuditEntry, Observation, RecordBase, TableName } from '../domain';
import { canonicalJson } from './canonical-json';
import { sha256Hex } from './crypto-box';
import { auditSnapshot } from './rows';
import { auditEntry, type StoreContext } from './store-context';

/**
 * From this many records created in one write, the audit log gets one batch entry instead of one
 * entry per record. Interactive saves (a visit: a handful of records) keep a full snapshot per
 * record; bulk writes (imports of measurements, a team sync) would otherwise write every record
 * twice, which halved the write rate on Chromium (see DEVELOPERS.md, store figures).
 */
export const BATCH_AUDIT_MIN_RECORDS = 100;

/** What a batch entry's `after` holds. */
export interface BatchAuditContent {
  /** Ids of the created records, in the order the digest covers them. */
  readonly recordIds: readonly string[];
  readonly count: number;
  /**
   * SHA-256 (hex) of canonicalJson of the array of the records' audit snapshots (auditSnapshot:
   * sealed text as a marker, trace samples as counts), in `recordIds` order.
   */
  readonly digest: { readonly algorithm: 'SHA-256'; readonly over: 'canonical-json-of-audit-snapshots'; readonly value: string };
}

/**
 * One audit entry for many records created together: action 'create', recordId null (so the
 * per-record index [table+recordId] stays small), who, where and when as for any entry, and in
 * `after` the ids and a digest of what was created.
 *
 * Why an auditor loses nothing: a created record is only ever changed through the repository,
 * which audits every later change with its full `before` snapshot. The state at creation is
 * therefore the `before` of the record's first later entry, or the current row when there is none;
 * recomputing the digest over those states proves the reconstruction (and detects an edit that
 * bypassed the store). Cost: one canonical serialisation of the batch and one SHA-256.
 */
export async function batchAuditEntry(ctx: StoreContext, at: string, table: TableName, rows: readonly RecordBase[]): Promise<AuditEntry> {
  const recordIds = rows.map((r) => r.id);
  const value = await sha256Hex(snapshotsJson(ctx, table, rows));
  const content: BatchAuditContent = { recordIds, count: rows.length, digest: { algorithm: 'SHA-256', over: 'canonical-json-of-audit-snapshots', value } };
  return auditEntry(ctx, at, 'create', table, null, null, content as unknown as Record<string, unknown>, `batch of ${rows.length} ${table}`);
}

/** canonicalJson of the rows' audit snapshots, in row order: the text a batch digest covers. */
function snapshotsJson(ctx: StoreContext, table: TableName, rows: readonly RecordBase[]): string {
  if (table === 'observations') return canonicalObservationsJson(rows as readonly Observation[]);
  // A snapshot differs from its row only where text is sealed or samples are counted; elsewhere
  // the rows themselves give the same canonical text without copying them.
  const plain = ctx.codecs[table].sealedFields.length === 0 && table !== 'traces';
  return canonicalJson(plain ? rows : rows.map((r) => auditSnapshot(table, r)));
}

/**
 * canonicalJson(observations) written out for the one shape observations have (an observation's
 * audit snapshot is the observation itself: nothing sealed, nothing counted): keys in code-unit
 * order, no whitespace. For valid observations only (validateRecord or validateObservation): ids,
 * times, side, mode and instrument are then plain ASCII that JSON writes as it is, and numbers finite
 * (JSON writes a finite number as String does, -0 as 0). Measure, site and grade codes are quoted by
 * JSON.stringify. Same text as canonicalJson (batch-audit.test.ts compares them on generated
 * observations of every kind); in Chromium canonicalJson's replacer-list serialisation was 1.0 s of
 * a 4.2 s bulk insert of 20,000 observations.
 */
export function canonicalObservationsJson(rows: readonly Observation[]): string {
  const parts: string[] = new Array<string>(rows.length);
  for (let i = 0; i < rows.length; i++) {
    const o = rows[i]!;
    parts[i] =
      `{"assessmentId":"${o.assessmentId}","clinicianId":"${o.clinicianId}","createdAt":"${o.createdAt}","deleted":${o.deleted},"deviceId":"${o.deviceId}",` +
      `"id":"${o.id}","instrument":${quoted(o.instrument)},"measureCode":${JSON.stringify(o.measureCode)},"mode":${quoted(o.mode)},"patientId":"${o.patientId}",` +
      `"side":"${o.side}","siteCode":${JSON.stringify(o.siteCode)},"takenAt":"${o.takenAt}","traceId":${quoted(o.traceId)},"updatedAt":"${o.updatedAt}","value":${valueJson(o.value)}}`;
  }
  if (parts.length === 0) return '[]';
  // Brackets inside the first and last parts: join then gives one flat string, which the digest's
  // UTF-8 encoding reads in one pass ('[' + joined + ']' would be a rope to flatten first).
  parts[0] = `[${parts[0]!}`;
  parts[parts.length - 1] += ']';
  return parts.join(',');
}

const quoted = (s: string | null) => (s === null ? 'null' : `"${s}"`);

function valueJson(v: Observation['value']): string {
  switch (v.kind) {
    case 'ordinal':
      return `{"grade":${JSON.stringify(v.grade)},"kind":"ordinal","rank":${v.rank}}`;
    case 'tardieu':
      return `{"kind":"tardieu","quality":${v.quality},"r1Deg":${v.r1Deg},"r2Deg":${v.r2Deg},"spasticityAngleDeg":${v.spasticityAngleDeg}}`;
    case 'angle':
      return `{"angleDeg":${v.angleDeg},"kind":"angle"}`;
    default:
      return `{"kind":"${v.kind}","value":${v.value}}`;
  }
}

/** The batch content of an entry, or null when it is no batch entry. */
export function batchContent(entry: AuditEntry): BatchAuditContent | null {
  if (entry.action !== 'create' || entry.recordId !== null || entry.after === null) return null;
  const after = entry.after as Partial<BatchAuditContent>;
  return Array.isArray(after.recordIds) && after.digest?.algorithm === 'SHA-256' ? (after as BatchAuditContent) : null;
}
