import {
  CohortExportCancelled,
  CohortExportError,
  disclosureFromRequest,
  prepareCohortExport,
  runCohortExport,
  type CohortGroupSummary,
} from '$lib/export';
import type { CohortExportFileResult, CohortExportRequest, CohortJobReply, PlainGroupSummary } from './cohort-export-protocol';

/** Fresh bytes from the platform's cryptographic source (page and worker alike). */
const cryptoBytes = (length: number): Uint8Array => crypto.getRandomValues(new Uint8Array(length));

const plainGroup = (g: CohortGroupSummary): PlainGroupSummary => ({
  ...g,
  quantity: { key: g.quantity.key, label: g.quantity.label, unit: g.quantity.unit, changeUnit: g.quantity.changeUnit, betterWhen: g.quantity.betterWhen },
});

/** Strings are gathered into a Blob every ~8 MiB, so the browser can move finished parts out of the JS heap. */
const BLOB_PART_CHARS = 8 * 1024 * 1024;

/**
 * Runs one export job where it is called (inside the worker, or on the main thread as the
 * fallback): prepares, reports, streams every file into a Blob, and yields to the event loop about
 * every 30 ms so that a cancel message (or the page) gets a turn. Exported for the worker.
 */
export async function runCohortExportJob(
  request: CohortExportRequest,
  emit: (reply: CohortJobReply) => void,
  isCancelled: () => boolean,
): Promise<void> {
  try {
    const prepared = await prepareCohortExport(request.records, {
      filters: request.filters,
      disclosure: disclosureFromRequest(request.disclosure, cryptoBytes),
      localMdc: request.localMdc,
      files: request.files,
      now: request.now,
    });
    const { cohort, files } = prepared;
    emit({
      type: 'prepared',
      prepared: {
        count: { patients: cohort.patientIds.length, pairs: cohort.pairs.length, observations: cohort.observationCount },
        groups: prepared.summary.groups.map(plainGroup),
        files: files.map(({ kind, fileName, mediaType, rows }) => ({ kind, fileName, mediaType, rows })),
      },
    });
    const fileResults: CohortExportFileResult[] = [];
    let blobs: Blob[] = [];
    let strings: string[] = [];
    let pending = 0;
    const flush = () => {
      if (strings.length > 0) blobs.push(new Blob(strings));
      strings = [];
      pending = 0;
    };
    let lastYield = performance.now();
    await runCohortExport(prepared, {
      onFileStart: () => {
        blobs = [];
        strings = [];
        pending = 0;
      },
      onChunk: (_file, text) => {
        strings.push(text);
        pending += text.length;
        if (pending >= BLOB_PART_CHARS) flush();
      },
      onFileEnd: (file) => {
        flush();
        fileResults.push({ kind: file.kind, fileName: file.fileName, mediaType: file.mediaType, rows: file.rows, blob: new Blob(blobs, { type: file.mediaType }) });
      },
      onProgress: (progress) => emit({ type: 'progress', progress }),
      isCancelled,
      pause: async () => {
        if (performance.now() - lastYield < 30) return;
        await new Promise((resolve) => setTimeout(resolve, 0));
        lastYield = performance.now();
      },
    });
    emit({ type: 'done', fileResults });
  } catch (error) {
    if (error instanceof CohortExportCancelled) emit({ type: 'error', message: error.message, reason: 'cancelled', field: null });
    else if (error instanceof CohortExportError) emit({ type: 'error', message: error.message, reason: 'refused', field: error.field });
    else emit({ type: 'error', message: error instanceof Error ? error.message : String(error), reason: 'failed', field: null });
  }
}
