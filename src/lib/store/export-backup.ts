import { TABLE_NAMES, type RandomBytes, type TableName } from '../domain';
import { BUNDLE_FORMAT, BUNDLE_FORMAT_VERSION, createBundle, emptyTables, serializeBundle, type BackupBundle, type BundleHeader, type BundleScope, type BundleTables } from './backup-bundle';
import { cryptoRandomBytes } from './crypto-box';
import { EXERCISE_PHOTOS_TABLE, type ExercisePhotoRow } from './exercise-photos';
import { encryptBundleText } from './encrypted-bundle';
import type { KinnoteStore } from './open-store';
import type { Row } from './rows';
import { LATEST_SCHEMA_VERSION } from './schema';
import { StoreError, toStoreError } from './store-error';
import { tableRows } from './table-rows';

export interface ExportOptions {
  /** Whole store (default) or one patient with what hangs on them. */
  readonly scope?: BundleScope;
  /** 'include' puts names and notes in clear into the bundle (needs the vault unlocked; encrypt the file). */
  readonly protectedContent: 'include' | 'omit';
  readonly source?: string;
}

const PATIENT_TABLES: ReadonlySet<TableName> = new Set(['identities', 'events', 'assessments', 'observations', 'traces', 'homeProgrammes', 'adherenceEntries', 'selfReports']);

/**
 * Exports records (tombstones included) as a checksummed bundle. One read transaction gives a
 * consistent snapshot. A patient scope takes the patient, every patient-scoped record of theirs,
 * all clinicians and devices (referenced by stamps) and the audit entries of the exported records;
 * reliability studies only travel in whole-store bundles. Throws Locked when protected content is
 * asked for while the vault is locked.
 */
export async function exportBackup(store: KinnoteStore, options: ExportOptions): Promise<BackupBundle> {
  const include = options.protectedContent === 'include';
  if (include && store.vault.status !== 'unlocked') {
    throw new StoreError('Locked', 'unlock the vault to export names and notes, or export without them');
  }
  const scope = options.scope ?? { kind: 'all' as const };
  const rows: Partial<Record<TableName, unknown[]>> = {};
  let photoRows: ExercisePhotoRow[] = [];
  try {
    await store.db.transaction('r', [...TABLE_NAMES, EXERCISE_PHOTOS_TABLE], async () => {
      // The photos of the exported programmes (read in the same snapshot), filtered below.
      photoRows = await store.db.table<ExercisePhotoRow, string>(EXERCISE_PHOTOS_TABLE).toArray();
      for (const table of TABLE_NAMES) {
        const t = tableRows(store.db, table);
        if (scope.kind === 'patient' && PATIENT_TABLES.has(table)) rows[table] = await t.ofPatient(scope.patientId);
        else if (scope.kind === 'patient' && table === 'patients') rows[table] = [...(await t.present([scope.patientId])).values()];
        else if (scope.kind === 'patient' && table === 'reliabilityStudies') rows[table] = [];
        else rows[table] = await t.all();
      }
    });
  } catch (error) {
    throw toStoreError(error, 'reading the store for export');
  }
  if (scope.kind === 'patient' && (rows.patients?.length ?? 0) === 0) throw new StoreError('NotFound', `patient ${scope.patientId} not found`);
  if (scope.kind === 'patient') {
    const ids = new Set<string>();
    for (const table of TABLE_NAMES) if (table !== 'audit') for (const r of rows[table] ?? []) ids.add((r as { id: string }).id);
    rows.audit = (rows.audit ?? []).filter((a) => ids.has((a as { recordId: string | null }).recordId ?? ''));
  }
  const exported = new Set((rows.homeProgrammes ?? []).map((p) => (p as { id: string; deleted: boolean }).deleted ? '' : (p as { id: string }).id));
  const photos = photoRows.filter((r) => exported.has(r.programmeId)).map(({ id: _id, addedAtMs: _at, ...photo }) => photo);
  const tables = emptyTables();
  for (const table of TABLE_NAMES) {
    const codec = store.context.codecs[table];
    const out = tables[table] as unknown[];
    for (const row of rows[table] ?? []) {
      if (include) out.push(await codec.fromRow(row as Row<typeof table> as never));
      else {
        const redacted = codec.redact(row as never);
        if (redacted !== null) out.push(redacted);
      }
    }
  }
  return createBundle(tables as Partial<BundleTables>, backupHeader(store, options.source ?? 'export', scope, include), photos);
}

/** The header of a backup this device writes now (the whole-store exporter's and the streamed backup's). */
export function backupHeader(store: KinnoteStore, source: BundleHeader['source'], scope: BundleScope, include: boolean): BundleHeader {
  return {
    format: BUNDLE_FORMAT,
    formatVersion: BUNDLE_FORMAT_VERSION,
    schemaVersion: LATEST_SCHEMA_VERSION,
    exportedAt: new Date(store.context.now()).toISOString(),
    exportedBy: store.actor,
    source,
    scope,
    protectedContent: include ? 'included' : 'omitted',
  };
}

/**
 * Exports to text ready for a file; with `passphrase`, wrapped in an encrypted backup
 * (PBKDF2-SHA-256 + AES-GCM; see encryptBundleText).
 */
export async function exportBackupText(
  store: KinnoteStore,
  options: ExportOptions & { passphrase?: string; iterations?: number; randomBytes?: RandomBytes },
): Promise<string> {
  const text = serializeBundle(await exportBackup(store, options));
  if (options.passphrase === undefined) return text;
  const encryptOptions: { randomBytes: RandomBytes; iterations?: number } = { randomBytes: options.randomBytes ?? cryptoRandomBytes };
  if (options.iterations !== undefined) encryptOptions.iterations = options.iterations;
  return encryptBundleText(text, options.passphrase, encryptOptions);
}

