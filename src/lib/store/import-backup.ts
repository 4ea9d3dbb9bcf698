import { withoutByteOrderMark } from '../domain';
import { verifyBundle, type VerifiedBundle } from './backup-bundle';
import { checkReferences, type OutsideLookup } from './check-references';
import { decryptBundleText, isEncryptedBundle } from './encrypted-bundle';
import { planPhotoImport, type PhotoMode } from './import-photos';
import { planMerge } from './import-plan';
import { readLocalRows } from './import-read-local';
import type { MergeReport, Planned } from './import-types';
import { importAudits, writeMerge } from './import-write';
import type { KinnoteStore } from './open-store';
import { tableRows } from './table-rows';
import { nextTimestamp, requireActor } from './store-context';
import { StoreError, toStoreError } from './store-error';

export type { MergeConflict, MergeReport, TableCounts } from './import-types';

export interface ReadBackupOptions {
  readonly passphrase?: string;
  /** The reading device's clock (ms since 1970); default the system clock. Stamps later than this plus 10 minutes are refused. */
  readonly now?: () => number;
  /** Where references that the bundle does not resolve may point (the store imported into); none: the bundle must be self-contained. */
  readonly outside?: OutsideLookup;
  /** Patient ids the caller vouches for although their record is absent (a phone's own patient). */
  readonly knownPatientIds?: readonly string[];
}

/**
 * Parses (and, for an encrypted backup, decrypts) backup text or an already parsed value, and
 * verifies it completely (verifyBundle, then checkReferences). A leading UTF-8 byte-order mark is
 * ignored, as browsers do when they read a file as text. Writes nothing.
 */
export async function readBackup(input: string | unknown, options: ReadBackupOptions = {}): Promise<VerifiedBundle> {
  let parsed: unknown = input;
  let text: string | undefined;
  if (typeof input === 'string') parsed = parseJson((text = withoutByteOrderMark(input)), 'backup');
  if (isEncryptedBundle(parsed)) {
    if (options.passphrase === undefined) throw new StoreError('WrongPassphrase', 'this backup is encrypted: enter its passphrase');
    text = await decryptBundleText(parsed, options.passphrase);
    parsed = parseJson(text, 'decrypted backup');
  }
  const bundle = await verifyBundle(parsed, (options.now ?? Date.now)(), text);
  await checkReferences(bundle.tables, options.outside ?? null, { patientIds: options.knownPatientIds ?? [], identitiesOmitted: bundle.header.protectedContent === 'omitted' });
  return bundle;
}

function parseJson(text: string, what: string): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch (cause) {
    throw new StoreError('InvalidBundle', `${what} is not complete JSON (truncated or damaged): ${(cause as Error).message}`, { cause });
  }
}

/**
 * Imports a backup: verifies everything first (a bad bundle changes nothing), then merges by id in
 * one transaction. Absent records are inserted; identical ones left alone; when both sides differ
 * the newer updatedAt wins (equal times: the larger canonical text, so every device settles alike),
 * and each such conflict gets an audit entry (before = local, after = incoming) and a line in the
 * report. Audit entries from the bundle are only ever added, each marked `importedBy` this device.
 * References must resolve in the bundle or the store (`knownPatientIds`: patients vouched for by
 * the caller although absent). With protected content omitted from
 * the bundle, local names and notes are kept. A second import of the same bundle writes nothing.
 * Throws StoreError (InvalidBundle, TamperedBundle, UnsupportedBundle, WrongPassphrase, Locked,
 * VersionConflict if the store changed during the import, QuotaExceeded, Aborted).
 */
export async function importBackup(
  store: KinnoteStore,
  input: string | unknown,
  options: {
    passphrase?: string;
    knownPatientIds?: readonly string[];
    /**
     * For a team server pull: by `table/id`, the updatedAt of the server's copy this device last knew
     * (its base). A local copy still at its base was not changed here since, so a newer incoming copy
     * replaces it as an ordinary edit, with no conflict; and an incoming copy this device wrote itself
     * that is older than the local one is its own past, kept out without a conflict.
     */
    syncBases?: ReadonlyMap<string, string>;
    photos?: PhotoMode;
  } = {},
): Promise<MergeReport> {
  // Step 1: read and verify the whole bundle (references may resolve in the store).
  const outside: OutsideLookup = async (table, ids) => {
    try {
      return new Set((await tableRows(store.db, table).present([...ids])).keys());
    } catch (error) {
      throw toStoreError(error, 'reading the store before import');
    }
  };
  const bundle = await readBackup(input, { ...options, now: store.context.now, outside });
  const at = nextTimestamp(store.context);
  const importedBy = { deviceId: requireActor(store.context).deviceId, importedAt: at };
  // Step 2: the local rows of the incoming ids. Step 3: the plan (decisions, sealing, conflicts).
  const local = await readLocalRows(store, bundle.tables);
  const plan = await planMerge(store, bundle, local, importedBy, options.syncBases);
  const programmeIds = (list: Planned[]) => new Set(list.filter((w) => w.table === 'homeProgrammes').map((w) => w.id));
  const photoPlan = await planPhotoImport(store, bundle, { written: programmeIds(plan.writes), keptLocal: programmeIds(plan.checks) }, options.photos ?? 'merge');
  const changed = plan.writes.length > 0 || plan.conflictAudits.length > 0 || photoPlan.written + photoPlan.removed > 0;
  const report: MergeReport = {
    header: bundle.header,
    checksum: bundle.checksum,
    changed,
    counts: plan.counts,
    conflicts: plan.conflicts,
    photos: { written: photoPlan.written, removed: photoPlan.removed },
  };
  if (!changed) return report;
  // Step 4: everything in one transaction.
  await writeMerge(store, plan, importAudits(store, bundle, plan, at, plan.counts), photoPlan);
  return report;
}
