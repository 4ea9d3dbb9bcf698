import { canonicalJson } from './canonical-json';
import type { KinnoteStore } from './open-store';
import { StoreError, toStoreError } from './store-error';

/**
 * Device-local state that is no record: it never travels in a backup and has no audit trail (e.g.
 * whether this device is a therapist's or a patient's own phone, and the patient's ticks behind
 * their weekly adherence entries). Kept in the meta table under `local:<name>` so it cannot
 * overwrite the vault, the actor or the settings. Values must be plain JSON.
 */
const KEY = /^local:[a-z][a-z0-9-]{0,63}$/;

function checkKey(key: string): void {
  if (!KEY.test(key)) throw new StoreError('ValidationFailed', `local state key ${JSON.stringify(key)} must look like "local:some-name"`);
}

/** The value saved under `key`, or undefined. Throws StoreError ValidationFailed for a bad key. */
export async function readLocalState(store: KinnoteStore, key: string): Promise<unknown> {
  checkKey(key);
  try {
    const row = (await store.db.table('meta').get(key)) as { key: string; value: unknown } | undefined;
    return row?.value;
  } catch (error) {
    throw toStoreError(error, `reading ${key}`);
  }
}

/**
 * Saves `value` under `key` (replacing what was there). Throws StoreError ValidationFailed for a
 * bad key or a value that is not plain JSON, QuotaExceeded when the device is full.
 */
export async function writeLocalState(store: KinnoteStore, key: string, value: unknown): Promise<void> {
  checkKey(key);
  try {
    canonicalJson(value);
  } catch (cause) {
    throw new StoreError('ValidationFailed', `local state ${key}: ${(cause as Error).message}`, { cause });
  }
  try {
    await store.db.table('meta').put({ key, value });
  } catch (error) {
    throw toStoreError(error, `saving ${key}`);
  }
}
