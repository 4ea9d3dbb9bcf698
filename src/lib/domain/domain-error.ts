/** One problem found while validating a record: where it is and what is wrong. */
export interface ValidationIssue {
  /** Dot path inside the record, e.g. `value.angleDeg`; empty for the record as a whole. */
  readonly path: string;
  readonly message: string;
}

/**
 * Thrown when a record does not satisfy its schema or the measure catalogue. The message names the
 * record kind, its id when known, and each field with its problem.
 */
export class DomainValidationError extends Error {
  override readonly name = 'DomainValidationError';
  constructor(
    readonly recordKind: string,
    readonly recordId: string | null,
    readonly issues: readonly ValidationIssue[],
  ) {
    super(
      `${recordKind}${recordId ? ` ${recordId}` : ''}: ` +
        issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message)).join('; '),
    );
  }
}
