import Dexie, { type DBCore, type Middleware } from 'dexie';
import { createUuidV7Generator, isTableName, type AuditEntry, type RandomBytes } from '../domain';
import { batchContent } from './batch-audit';
import { keepCaseloadSummaries, readCaseloadSummaries, readFirstCaseloadRows, type CaseloadSummaryRow } from './caseload-summaries';
import { makeCodecs } from './codecs';
import { DEFAULT_KDF_ITERATIONS, cryptoRandomBytes } from './crypto-box';
import { IdentityRepository, ObservationRepository, Repository } from './repository';
import { LATEST_SCHEMA_VERSION, declareSchema } from './schema';
import { auditEntry, type Actor, type StoreContext } from './store-context';
import { installedNativeVersion } from './installed-version';
import { StoreError, toStoreError } from './store-error';
import { tableRows } from './table-rows';
import { Vault, type Timers, type VaultRecord } from './vault';

export interface OpenStoreOptions {
  /** IndexedDB database name; default "kinnote". */
  readonly name?: string;
  /** Clock in Unix ms; default Date.now. */
  readonly now?: () => number;
  /** Random source for ids, salts and nonces; default crypto.getRandomValues. */
  readonly randomBytes?: RandomBytes;
  /** An IndexedDB implementation (fake-indexeddb in Node tests); default the global one. */
  readonly indexedDB?: IDBFactory;
  readonly IDBKeyRange?: typeof IDBKeyRange;
  /** PBKDF2 iterations for a new vault passphrase; default 600,000. Only tests pass fewer. */
  readonly kdfIterations?: number;
  /** Idle time before the vault locks itself; default from settings, else 5 minutes; null never. */
  readonly idleTimeoutMs?: number | null;
  readonly timers?: Timers;
  /** Who writes; default the actor saved by ensureActor/setActor on this device. */
  readonly actor?: Actor;
  /** Dexie middleware layered under the store (tests use it to inject storage faults). */
  readonly middleware?: readonly Middleware<DBCore>[];
}

/**
 * Stamps follow the team server's clock once a team sync has measured this device's offset from it
 * (team-sync.ts), so every device of a team stamps on one time line whatever its own clock says;
 * without a team the offset stays 0. Saved on the device; never in a backup.
 */
export interface StoreClock {
  /** This device's own clock (ms since 1970). */
  readonly device: () => number;
  /** Added to the device's clock for every stamp. */
  readonly offsetMs: number;
  setOffset(ms: number): Promise<void>;
}

const CLOCK_OFFSET_KEY = 'local:clock-offset';

export interface StoreSettings {
  readonly idleTimeoutMs: number | null;
}

const DEFAULT_IDLE_MS = 5 * 60 * 1000;

/** The record store: repositories per record kind, the vault, the audit log and settings. */
export interface KinnoteStore {
  readonly db: Dexie;
  readonly vault: Vault;
  readonly context: StoreContext;
  readonly patients: Repository<'patients'>;
  readonly identities: IdentityRepository;
  readonly clinicians: Repository<'clinicians'>;
  readonly devices: Repository<'devices'>;
  readonly events: Repository<'events'>;
  readonly assessments: Repository<'assessments'>;
  readonly observations: ObservationRepository;
  readonly traces: Repository<'traces'>;
  readonly homeProgrammes: Repository<'homeProgrammes'>;
  readonly adherenceEntries: Repository<'adherenceEntries'>;
  readonly selfReports: Repository<'selfReports'>;
  readonly reliabilityStudies: Repository<'reliabilityStudies'>;
  readonly audit: {
    /** Audit entries of one record, oldest first. */
    forRecord(table: string, recordId: string): Promise<AuditEntry[]>;
    /** The most recent entries, newest first. */
    recent(limit: number): Promise<AuditEntry[]>;
    count(): Promise<number>;
    /** Records that data left the device (e.g. an identified cohort export), with a plain note. */
    logExport(note: string): Promise<void>;
  };
  /**
   * Every live patient with their caseload summary (last assessment, changes beyond MDC), one
   * small stored row per patient kept up to date on write (caseload-summaries.ts).
   */
  caseload(): Promise<CaseloadSummaryRow[]>;
  /**
   * The first `limit` rows of the caseload's default view (live active patients, soonest due first)
   * from an index, at a cost that does not grow with the caseload; null when some summary is stale.
   */
  caseloadFirstRows(limit: number): Promise<CaseloadSummaryRow[] | null>;
  readonly actor: Actor | null;
  /** Sets (and saves on this device) who is writing. */
  setActor(actor: Actor): Promise<void>;
  /**
   * First run on a device: creates the Device and Clinician records (each stamped with itself)
   * unless an actor is already saved, saves the actor and returns it.
   */
  ensureActor(first: { deviceName: string; platform: string | null; clinicianName: string; profession: 'physiotherapist' | 'occupational-therapist' | 'physician' | 'nurse' | 'other' }): Promise<Actor>;
  /** The clock records are stamped with: this device's own, corrected by what its team server told it. */
  readonly clock: StoreClock;
  readonly settings: StoreSettings;
  /** Saves the lock timeout and applies it to the vault. */
  setIdleTimeoutMs(ms: number | null): Promise<void>;
  close(): void;
}

/**
 * Opens (creating or upgrading) the Kinnote database and returns its store. Upgrades run every
 * pending migration in order (schema.ts). Throws StoreError VersionConflict when the database on
 * disk is newer than this app, DatabaseUnavailable when IndexedDB is missing or blocked.
 */
export async function openStore(options: OpenStoreOptions = {}): Promise<KinnoteStore> {
  const deviceNow = options.now ?? (() => Date.now());
  let clockOffsetMs = 0;
  const now = () => deviceNow() + clockOffsetMs;
  const randomBytes = options.randomBytes ?? cryptoRandomBytes;
  const dexieOptions: { indexedDB?: IDBFactory; IDBKeyRange?: typeof IDBKeyRange } = {};
  if (options.indexedDB) dexieOptions.indexedDB = options.indexedDB;
  if (options.IDBKeyRange) dexieOptions.IDBKeyRange = options.IDBKeyRange;
  const name = options.name ?? 'kinnote';
  const factory = options.indexedDB ?? (globalThis as { indexedDB?: IDBFactory }).indexedDB;
  if (!factory) throw new StoreError('DatabaseUnavailable', 'opening the database: IndexedDB is not available in this browser');
  let installed: number;
  try {
    installed = await installedNativeVersion(factory, name);
  } catch (error) {
    throw toStoreError(error, 'opening the database');
  }
  // Dexie stores version × 10 in IndexedDB. Refuse a newer database before Dexie can patch it.
  if (installed / 10 > LATEST_SCHEMA_VERSION) {
    throw new StoreError('VersionConflict', `the database on this device is from a newer Kinnote (schema ${installed / 10}, this app knows ${LATEST_SCHEMA_VERSION}); update the app`);
  }
  // 'strict': a transaction counts as done only once it is on disk (not just handed to the OS), so
  // a saved assessment or a kept draft survives a browser or power failure right after. Browsers
  // without the hint ignore it. Writes here are a person's pace, so the flush costs little.
  const db = new Dexie(name, { ...dexieOptions, chromeTransactionDurability: 'strict' });
  declareSchema(db);
  keepCaseloadSummaries(db);
  for (const layer of options.middleware ?? []) db.use(layer);
  try {
    await db.open();
  } catch (error) {
    throw toStoreError(error, 'opening the database');
  }
  // A newer app may have upgraded the database between the probe and this open (another tab).
  const onDisk = Math.max(db.verno, db.backendDB().version / 10);
  if (onDisk > LATEST_SCHEMA_VERSION) {
    db.close();
    throw new StoreError('VersionConflict', `the database on this device is from a newer Kinnote (schema ${onDisk}, this app knows ${LATEST_SCHEMA_VERSION}); update the app`);
  }
  const meta = db.table<{ key: string; value: unknown }, string>('meta');
  const readMeta = async <T>(key: string): Promise<T | undefined> => (await meta.get(key))?.value as T | undefined;

  clockOffsetMs = (await readMeta<number>(CLOCK_OFFSET_KEY)) ?? 0;
  const settings: { idleTimeoutMs: number | null } = {
    idleTimeoutMs: (await readMeta<StoreSettings>('settings'))?.idleTimeoutMs ?? DEFAULT_IDLE_MS,
  };
  if (options.idleTimeoutMs !== undefined) settings.idleTimeoutMs = options.idleTimeoutMs;

  const vault = new Vault(
    {
      read: () => readMeta<VaultRecord>('vault'),
      write: async (record) => {
        try {
          await meta.put({ key: 'vault', value: record });
        } catch (error) {
          throw toStoreError(error, 'saving the vault');
        }
      },
    },
    {
      randomBytes,
      now: deviceNow,
      iterations: options.kdfIterations ?? DEFAULT_KDF_ITERATIONS,
      timers: options.timers ?? {
        setTimeout: (fn, ms) => globalThis.setTimeout(fn, ms),
        clearTimeout: (handle) => globalThis.clearTimeout(handle as ReturnType<typeof setTimeout>),
      },
      idleTimeoutMs: settings.idleTimeoutMs,
    },
  );
  await vault.load();

  let actor: Actor | null = options.actor ?? (await readMeta<Actor>('actor')) ?? null;
  const ids = createUuidV7Generator(now, randomBytes);
  const context: StoreContext = {
    db,
    vault,
    codecs: makeCodecs(vault),
    now,
    newId: ids,
    newIds: ids.many,
    actor: () => actor,
  };
  const audit = db.table<AuditEntry, string>('audit');

  const store: KinnoteStore = {
    db,
    vault,
    context,
    patients: new Repository(context, 'patients'),
    identities: new IdentityRepository(context, 'identities'),
    clinicians: new Repository(context, 'clinicians'),
    devices: new Repository(context, 'devices'),
    events: new Repository(context, 'events'),
    assessments: new Repository(context, 'assessments'),
    observations: new ObservationRepository(context, 'observations'),
    traces: new Repository(context, 'traces'),
    homeProgrammes: new Repository(context, 'homeProgrammes'),
    adherenceEntries: new Repository(context, 'adherenceEntries'),
    selfReports: new Repository(context, 'selfReports'),
    reliabilityStudies: new Repository(context, 'reliabilityStudies'),
    audit: {
      forRecord: async (table, recordId) => {
        const entries = await audit.where('[table+recordId]').equals([table, recordId]).toArray();
        // A record created in bulk is named by a batch entry stamped with the record's createdAt.
        const row = isTableName(table) ? ((await tableRows(db, table).get(recordId)) as { createdAt?: string } | undefined) : undefined;
        if (row?.createdAt) {
          for (const e of await audit.where('createdAt').equals(row.createdAt).toArray()) {
            if (e.table === table && batchContent(e)?.recordIds.includes(recordId)) entries.push(e);
          }
        }
        return entries.sort((a, b) => (a.id < b.id ? -1 : 1));
      },
      recent: (limit) => audit.orderBy('id').reverse().limit(limit).toArray(),
      count: () => audit.count(),
      logExport: async (note) => {
        const at = new Date(now()).toISOString();
        try {
          await audit.add(auditEntry(context, at, 'export', '*', null, null, null, note));
        } catch (error) {
          throw toStoreError(error, 'logging the export');
        }
      },
    },
    clock: {
      device: deviceNow,
      get offsetMs() {
        return clockOffsetMs;
      },
      async setOffset(ms: number) {
        if (!Number.isFinite(ms)) throw new StoreError('ValidationFailed', `clock offset: ${ms} is not a number of milliseconds`);
        try {
          await meta.put({ key: CLOCK_OFFSET_KEY, value: Math.round(ms) });
        } catch (error) {
          throw toStoreError(error, 'saving the clock offset');
        }
        clockOffsetMs = Math.round(ms);
      },
    },
    get actor() {
      return actor;
    },
    async setActor(next) {
      try {
        await meta.put({ key: 'actor', value: next });
      } catch (error) {
        throw toStoreError(error, 'saving the device and clinician');
      }
      actor = next;
    },
    async ensureActor(first) {
      if (actor) return actor;
      const deviceId = context.newId();
      const clinicianId = context.newId();
      const at = new Date(now()).toISOString();
      const stamps = { createdAt: at, updatedAt: at, deviceId, clinicianId, deleted: false };
      actor = { deviceId, clinicianId };
      try {
        await db.transaction('rw', ['devices', 'clinicians', 'meta', 'audit'], async () => {
          const device = { ...stamps, id: deviceId, name: first.deviceName, platform: first.platform };
          const clinician = { ...stamps, id: clinicianId, displayName: first.clinicianName, profession: first.profession, registration: null };
          await db.table('devices').add(device);
          await db.table('clinicians').add(clinician);
          await meta.put({ key: 'actor', value: actor });
          const base = { createdAt: at, updatedAt: at, deviceId, clinicianId, deleted: false, before: null, note: 'first run on this device' };
          await audit.bulkAdd([
            { ...base, id: context.newId(), action: 'create', table: 'devices', recordId: deviceId, after: device },
            { ...base, id: context.newId(), action: 'create', table: 'clinicians', recordId: clinicianId, after: clinician },
          ]);
        });
      } catch (error) {
        actor = null;
        throw toStoreError(error, 'registering this device');
      }
      return actor;
    },
    caseload: () => readCaseloadSummaries(db),
    caseloadFirstRows: (limit) => readFirstCaseloadRows(db, limit),
    get settings() {
      return { ...settings };
    },
    async setIdleTimeoutMs(ms) {
      if (ms !== null && !(ms > 0)) throw new StoreError('ValidationFailed', 'the lock timeout must be above 0, or never');
      try {
        await meta.put({ key: 'settings', value: { ...settings, idleTimeoutMs: ms } });
      } catch (error) {
        throw toStoreError(error, 'saving settings');
      }
      settings.idleTimeoutMs = ms;
      vault.setIdleTimeoutMs(ms);
    },
    close() {
      vault.lock();
      db.close();
    },
  };
  return store;
}
