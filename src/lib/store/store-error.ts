/**
 * The closed list of store failures the UI can name to the user. Each keeps its cause.
 * - QuotaExceeded: the device is out of storage; nothing of the failed write was kept.
 * - VersionConflict: the record (or the database) changed since it was read; reload and retry.
 * - Aborted: the transaction was aborted (by the browser or by an error inside it); nothing kept.
 * - ValidationFailed: a record failed its schema or the measure catalogue; `issues` say where.
 * - NotFound: no record with that id.
 * - Locked: protected text (names, notes) needs the vault unlocked, or a passphrase set first.
 * - WrongPassphrase: the passphrase does not open the vault or the encrypted backup.
 * - TamperedBundle: a backup's checksum or authentication tag does not match: refused whole.
 * - InvalidBundle: a backup is not well-formed or holds invalid records; `issues` name record and field.
 * - UnsupportedBundle: a backup from a newer or unknown format version.
 * - DatabaseUnavailable: IndexedDB is missing, blocked or closed.
 * - Unknown: anything else (the cause says what).
 */
export type StoreErrorCode =
  | 'QuotaExceeded'
  | 'VersionConflict'
  | 'Aborted'
  | 'ValidationFailed'
  | 'NotFound'
  | 'Locked'
  | 'WrongPassphrase'
  | 'TamperedBundle'
  | 'InvalidBundle'
  | 'UnsupportedBundle'
  | 'DatabaseUnavailable'
  | 'Unknown';

export interface StoreIssue {
  /** e.g. `tables.observations[3] (0190…)`, or the table and id for a repository write. */
  readonly record: string;
  /** Dot path inside the record. */
  readonly path: string;
  readonly message: string;
}

/** The one error type the store throws. `code` is from a closed list; `cause` keeps the original. */
export class StoreError extends Error {
  override readonly name = 'StoreError';
  constructor(
    readonly code: StoreErrorCode,
    message: string,
    options: { cause?: unknown; issues?: readonly StoreIssue[] } = {},
  ) {
    super(message, options.cause === undefined ? undefined : { cause: options.cause });
    this.issues = options.issues ?? [];
  }
  readonly issues: readonly StoreIssue[];
}

/** Formats up to `max` issues into one line for a message. */
export function describeIssues(issues: readonly StoreIssue[], max = 5): string {
  const shown = issues.slice(0, max).map((i) => `${i.record}${i.path ? ` ${i.path}` : ''}: ${i.message}`);
  const more = issues.length > max ? `; and ${issues.length - max} more` : '';
  return shown.join('; ') + more;
}

// Names seen on DOMException, Dexie's wrappers and their `inner` errors.
const BY_NAME: Readonly<Record<string, StoreErrorCode>> = {
  QuotaExceededError: 'QuotaExceeded',
  VersionError: 'VersionConflict',
  AbortError: 'Aborted',
  TransactionInactiveError: 'Aborted',
  DatabaseClosedError: 'DatabaseUnavailable',
  MissingAPIError: 'DatabaseUnavailable',
  OpenFailedError: 'DatabaseUnavailable',
  InvalidStateError: 'DatabaseUnavailable',
};

function findCode(error: unknown, depth = 0): StoreErrorCode | undefined {
  if (depth > 5 || typeof error !== 'object' || error === null) return undefined;
  const e = error as { name?: unknown; inner?: unknown; cause?: unknown; failures?: unknown };
  // Inner causes first: Dexie wraps a QuotaExceededError in an AbortError of the transaction.
  const inner = findCode(e.inner, depth + 1) ?? findCode(e.cause, depth + 1);
  if (inner && inner !== 'Aborted') return inner;
  if (Array.isArray(e.failures)) {
    for (const f of e.failures) {
      const code = findCode(f, depth + 1);
      if (code) return code;
    }
  }
  const own = typeof e.name === 'string' ? BY_NAME[e.name] : undefined;
  return own ?? inner;
}

/**
 * Maps anything thrown at the storage edge to a StoreError, keeping the original as `cause`.
 * A StoreError passes through unchanged. Looks through Dexie's `inner` and bulk `failures`.
 */
export function toStoreError(error: unknown, context: string): StoreError {
  if (error instanceof StoreError) return error;
  const code = findCode(error) ?? 'Unknown';
  const detail = error instanceof Error ? error.message : String(error);
  const what: Record<StoreErrorCode, string> = {
    QuotaExceeded: 'the device is out of storage space; nothing was saved. Free space or export a backup, then try again',
    VersionConflict: 'the data changed meanwhile (another tab or a newer app version); reload and try again',
    Aborted: 'the save was interrupted; nothing was saved',
    ValidationFailed: 'invalid record',
    NotFound: 'not found',
    Locked: 'unlock first',
    WrongPassphrase: 'wrong passphrase',
    TamperedBundle: 'the backup has been altered',
    InvalidBundle: 'invalid backup',
    UnsupportedBundle: 'unsupported backup',
    DatabaseUnavailable: 'the on-device database is not available',
    Unknown: 'unexpected storage error',
  };
  return new StoreError(code, `${context}: ${what[code]} (${detail})`, { cause: error });
}
