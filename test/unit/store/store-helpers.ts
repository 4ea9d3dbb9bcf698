import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import type { DBCore, DBCoreMutateRequest, Middleware } from 'dexie';
import { ordinalValue } from '../../../src/lib/domain';
import { openStore, type KinnoteStore } from '../../../src/lib/store';
import { type OpenStoreOptions } from '../../../src/lib/store/open-store';

/** A test clock: starts at 2025-03-01T09:00Z and moves 1 s per reading. */
export function steppingClock(startMs = Date.UTC(2025, 2, 1, 9)): () => number {
  let t = startMs;
  return () => (t += 1000);
}

/** Iterations for tests that are not about the KDF (one test runs the full 600,000). */
export const TEST_ITERATIONS = 1000;

/** A fresh, isolated store on its own fake IndexedDB, with an actor and (optionally) an unlocked vault. */
export async function freshStore(
  options: Partial<OpenStoreOptions> & { passphrase?: string | null; indexedDB?: IDBFactory } = {},
): Promise<KinnoteStore & { factory: IDBFactory }> {
  const factory = options.indexedDB ?? new IDBFactory();
  const store = await openStore({
    name: 'kinnote-test',
    now: steppingClock(),
    kdfIterations: TEST_ITERATIONS,
    idleTimeoutMs: null,
    ...options,
    indexedDB: factory,
    IDBKeyRange,
  });
  if (!store.actor) await store.ensureActor({ deviceName: 'Test tablet', platform: 'node', clinicianName: 'Test Clinician', profession: 'physiotherapist' });
  const passphrase = options.passphrase === undefined ? 'correct horse battery' : options.passphrase;
  if (passphrase !== null && store.vault.status === 'unset') await store.vault.setup(passphrase);
  return Object.assign(store, { factory });
}

/** Creates a patient with one assessment (with notes) and one MAS observation. */
export async function seedPatient(store: KinnoteStore, code = 'K7QM-3XHD') {
  const patient = await store.patients.create({ code, birthYear: 1961, condition: 'stroke', affectedSides: ['left'], status: 'active' });
  const assessment = await store.assessments.create({
    patientId: patient.id,
    assessorId: store.actor!.clinicianId,
    performedAt: '2025-03-01T10:00:00.000Z',
    setting: 'clinic',
    conditions: { position: 'supine', minutesSinceMedication: null, painNrs: 2 },
    notes: 'Invented note: stiffer in the cold',
  });
  const observation = await store.observations.create({
    patientId: patient.id,
    assessmentId: assessment.id,
    takenAt: assessment.performedAt,
    measureCode: 'mas',
    siteCode: 'elbow-flexors',
    side: 'left',
    mode: null,
    instrument: null,
    value: ordinalValue('mas', '1+'),
    traceId: null,
  });
  return { patient, assessment, observation };
}

/** Every row of every table, for before/after comparisons. */
export async function dumpAll(store: KinnoteStore): Promise<Record<string, unknown[]>> {
  const out: Record<string, unknown[]> = {};
  for (const table of store.db.tables) out[table.name] = await table.toArray();
  return out;
}

/**
 * Dexie middleware that lets `allowed` mutations through once armed, then fails each one with a
 * DOMException named QuotaExceededError, as a full disk does inside a transaction.
 */
export function quotaFault(allowed: number): Middleware<DBCore> & { armed: boolean } {
  let count = 0;
  const fault = {
    stack: 'dbcore' as const,
    name: 'quota-fault',
    armed: false,
    create(down: DBCore): DBCore {
      return {
        ...down,
        table(name: string) {
          const table = down.table(name);
          return {
            ...table,
            mutate(req: DBCoreMutateRequest) {
              if (fault.armed && count++ >= allowed) return Promise.reject(new DOMException('The quota has been exceeded.', 'QuotaExceededError'));
              return table.mutate(req);
            },
          };
        },
      };
    },
  };
  return fault;
}
