/** The part of navigator.storage the store uses (passed in for tests; the page passes nothing). */
export interface StorageManagerLike {
  persist?: () => Promise<boolean>;
  persisted?: () => Promise<boolean>;
  estimate?: () => Promise<{ usage?: number; quota?: number }>;
}

function defaultStorage(): StorageManagerLike | undefined {
  return (globalThis as { navigator?: { storage?: StorageManagerLike } }).navigator?.storage;
}

/**
 * Asks the browser to keep this site's data under storage pressure (navigator.storage.persist).
 * Returns 'granted', 'denied' or 'unsupported'; never throws (a refusal is not an error).
 */
export async function requestPersistentStorage(storage: StorageManagerLike | undefined = defaultStorage()): Promise<'granted' | 'denied' | 'unsupported'> {
  if (!storage?.persist) return 'unsupported';
  try {
    if (storage.persisted && (await storage.persisted())) return 'granted';
    return (await storage.persist()) ? 'granted' : 'denied';
  } catch {
    return 'denied';
  }
}

/** Bytes used and available to this site (navigator.storage.estimate), or null where unsupported. */
export async function storageUsage(
  storage: StorageManagerLike | undefined = defaultStorage(),
): Promise<{ usageBytes: number; quotaBytes: number; persisted: boolean | null } | null> {
  if (!storage?.estimate) return null;
  try {
    const { usage, quota } = await storage.estimate();
    const persisted = storage.persisted ? await storage.persisted() : null;
    return { usageBytes: usage ?? 0, quotaBytes: quota ?? 0, persisted };
  } catch {
    return null;
  }
}
