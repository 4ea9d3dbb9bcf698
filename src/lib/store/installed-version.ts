/**
 * The version of the database `name` as it is on disk, read without changing it: 0 when no such
 * database exists. Opening without a version number opens the current one; if the database did not
 * exist, the request's upgrade transaction is aborted so that the probe never creates it.
 *
 * Why: Dexie 4 opens a database whose version is above every declared one and, finding tables it
 * does not know, "patches" it (adds its own tables and bumps the version, with a SchemaDiff warning).
 * A database written by a newer Kinnote must be refused before Dexie touches it.
 * Returned as IndexedDB's native number (Dexie stores its version × 10).
 */
export function installedNativeVersion(factory: IDBFactory, name: string): Promise<number> {
  return new Promise((resolve, reject) => {
    let created = false;
    const request = factory.open(name);
    request.onupgradeneeded = () => {
      // Only reached when the database did not exist (oldVersion 0): do not create it here.
      created = true;
      request.transaction?.abort();
    };
    request.onsuccess = () => {
      const version = request.result.version;
      request.result.close();
      resolve(version);
    };
    request.onerror = (event) => {
      if (created) {
        // The abort above: no database, nothing written.
        event.preventDefault();
        resolve(0);
      } else reject(request.error ?? new Error(`could not read the version of database "${name}"`));
    };
    request.onblocked = () => reject(new Error(`database "${name}" is blocked by another tab`));
  });
}
