import { buildCohortIndex, type CohortIndex } from './cohort-index';
import type { CohortFilters, CohortRecords, LocalMdc } from './cohort-types';
import { fhirBundleChunks } from './fhir-bundle';
import { longCsvChunks } from './long-csv';
import { prepareDisclosure, type Disclosure, type DisclosurePlan } from './prepare-disclosure';
import { selectCohort, type Cohort } from './select-cohort';
import { summariseCohort, type CohortSummary } from './summarise-cohort';
import { summaryCsvChunks } from './summary-csv';
import type { TextChunk } from './text-chunk';
import { wideCsvChunks, wideRowCount } from './wide-csv';

export type CohortFileKind = 'long' | 'wide' | 'summary' | 'fhir';
export const COHORT_FILE_KINDS: readonly CohortFileKind[] = ['long', 'wide', 'summary', 'fhir'];

/** One file of the export: its name, media type, data rows (resources for FHIR), and its text as chunks. */
export interface CohortFile {
  readonly kind: CohortFileKind;
  readonly fileName: string;
  readonly mediaType: string;
  readonly rows: number;
  /** A fresh generator each call; the text is produced as it is read. */
  readonly chunks: () => Iterable<TextChunk>;
}

export interface CohortExportOptions {
  readonly filters: CohortFilters;
  readonly disclosure: Disclosure;
  readonly localMdc?: readonly LocalMdc[];
  /** Which files; default all four. */
  readonly files?: readonly CohortFileKind[];
  /** ISO instant for the FHIR Bundle.timestamp (the core never reads the clock). */
  readonly now?: string;
  readonly chunkChars?: number;
}

/** The cohort, its summary, the disclosure plan and the files, ready to stream. */
export interface PreparedCohortExport {
  readonly index: CohortIndex;
  readonly cohort: Cohort;
  readonly summary: CohortSummary;
  readonly plan: DisclosurePlan;
  readonly files: readonly CohortFile[];
}

const FILE_NAMES: Record<CohortFileKind, { name: string; mediaType: string }> = {
  long: { name: 'kinnote-cohort-long.csv', mediaType: 'text/csv;charset=utf-8' },
  wide: { name: 'kinnote-cohort-wide.csv', mediaType: 'text/csv;charset=utf-8' },
  summary: { name: 'kinnote-cohort-summary.csv', mediaType: 'text/csv;charset=utf-8' },
  fhir: { name: 'kinnote-cohort-fhir.json', mediaType: 'application/fhir+json' },
};

/**
 * A file name to save under that says what is inside, e.g.
 * "kinnote-cohort-2026-03-01-mas-elbow-flexors-left-botulinum-toxin-injection-wide.csv" (export day from
 * `now`, then the measure, site, side and anchoring event filters that are set). The command line keeps
 * the plain names (kinnote-cohort-wide.csv) in the folder it is given.
 */
export function cohortFileName(kind: CohortFileKind, filters: CohortFilters, now: string | undefined): string {
  const parts = ['kinnote-cohort', now?.slice(0, 10), filters.measureCode, filters.siteCode, filters.side, filters.anchor?.kind];
  const slug = parts.filter((p): p is string => typeof p === 'string' && p !== '').map((p) => p.replace(/[^A-Za-z0-9-]+/g, '-'));
  return `${slug.join('-')}-${FILE_NAMES[kind].name.replace('kinnote-cohort-', '')}`;
}

/**
 * Selects, summarises and prepares the disclosure of a cohort, and describes its files (long,
 * wide and summary CSV, FHIR R4 Bundle). Pass an index from buildCohortIndex to reuse it, or the
 * records. Nothing is written yet: each file's `chunks()` produces its text on demand.
 * Throws CohortExportError for bad filters or options.
 *
 * @example
 * const prepared = await prepareCohortExport(tables, { filters: { measureCode: 'mas' }, disclosure: disclosureFromRequest({ kind: 'deidentified', dates: 'days-from-baseline' }, randomBytes) });
 * prepared.files.map((f) => f.fileName); // long, wide and summary CSV and the FHIR bundle
 * await runCohortExport(prepared, { onChunk: (file, text) => write(file, text) });
 */
export async function prepareCohortExport(source: CohortRecords | CohortIndex, options: CohortExportOptions): Promise<PreparedCohortExport> {
  const index = 'series' in source ? source : buildCohortIndex(source);
  const cohort = selectCohort(index, options.filters);
  const summary = summariseCohort(cohort, { localMdc: options.localMdc ?? [] });
  const plan = await prepareDisclosure(cohort, index, options.disclosure);
  const chunkChars = options.chunkChars;
  const make = (kind: CohortFileKind, rows: number, chunks: () => Iterable<TextChunk>): CohortFile => ({
    kind,
    fileName: FILE_NAMES[kind].name,
    mediaType: FILE_NAMES[kind].mediaType,
    rows,
    chunks,
  });
  const all: Record<CohortFileKind, () => CohortFile> = {
    long: () => make('long', cohort.observationCount, () => longCsvChunks(cohort, plan, chunkChars)),
    wide: () => make('wide', wideRowCount(cohort), () => wideCsvChunks(cohort, summary, plan, chunkChars)),
    summary: () => make('summary', summary.groups.length, () => summaryCsvChunks(summary)),
    fhir: () => make('fhir', cohort.patientIds.length + cohort.observationCount, () => fhirBundleChunks(cohort, plan, { now: options.now, chunkChars })),
  };
  const files = (options.files ?? COHORT_FILE_KINDS).map((kind) => all[kind]());
  return { index, cohort, summary, plan, files };
}

/** Progress of a running export. */
export interface CohortExportProgress {
  readonly file: CohortFileKind;
  readonly fileRowsDone: number;
  readonly fileRowsTotal: number;
  readonly rowsDone: number;
  readonly rowsTotal: number;
}

/** Thrown by runCohortExport when `isCancelled` says so. */
export class CohortExportCancelled extends Error {
  override readonly name = 'CohortExportCancelled';
  constructor() {
    super('the export was cancelled');
  }
}

export interface CohortExportHooks {
  /** Receives each file's text in order; may return a promise (back-pressure). */
  readonly onChunk: (file: CohortFile, text: string) => void | Promise<void>;
  readonly onFileStart?: (file: CohortFile) => void | Promise<void>;
  readonly onFileEnd?: (file: CohortFile) => void | Promise<void>;
  readonly onProgress?: (progress: CohortExportProgress) => void;
  /** Checked after every chunk; true stops the export with CohortExportCancelled. */
  readonly isCancelled?: () => boolean;
  /** Awaited after every chunk: a worker yields here now and then, so a cancel message gets through. */
  readonly pause?: () => Promise<void>;
}

/**
 * Streams every file of a prepared export through `hooks.onChunk`, reporting progress after each
 * chunk (about 64 KiB) and honouring cancellation between chunks. Memory stays at one chunk per
 * file plus what the consumer keeps. Throws CohortExportCancelled when cancelled.
 */
export async function runCohortExport(prepared: PreparedCohortExport, hooks: CohortExportHooks): Promise<void> {
  const rowsTotal = prepared.files.reduce((sum, f) => sum + f.rows, 0);
  let rowsDone = 0;
  for (const file of prepared.files) {
    if (hooks.isCancelled?.()) throw new CohortExportCancelled();
    await hooks.onFileStart?.(file);
    let fileRowsDone = 0;
    hooks.onProgress?.({ file: file.kind, fileRowsDone, fileRowsTotal: file.rows, rowsDone, rowsTotal });
    for (const chunk of file.chunks()) {
      await hooks.onChunk(file, chunk.text);
      fileRowsDone += chunk.rows;
      rowsDone += chunk.rows;
      hooks.onProgress?.({ file: file.kind, fileRowsDone, fileRowsTotal: file.rows, rowsDone, rowsTotal });
      if (hooks.isCancelled?.()) throw new CohortExportCancelled();
      await hooks.pause?.();
    }
    await hooks.onFileEnd?.(file);
  }
}
