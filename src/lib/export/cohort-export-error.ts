/**
 * The one error the export module throws for input it refuses: a filter, option or record that
 * makes no sense. `field` names what is wrong (e.g. "filters.fromDate", "options.keyBytes").
 */
export class CohortExportError extends Error {
  override readonly name = 'CohortExportError';
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(`${field}: ${message}`);
  }
}
