import {
  buildCohortIndex,
  CohortExportCancelled,
  CohortExportError,
  countCohort,
  prepareCohortExport,
  runCohortExport,
  type CohortCount,
  type CohortExportProgress,
  type CohortFileKind,
  type CohortFilters,
  type CohortGroupSummary,
  type CohortRecords,
  type Disclosure,
  type LocalMdc,
} from '$lib/export';
import type { Identity } from '$lib/domain';

/**
 * Who the export may name, as the page asks for it. The per-export HMAC key and the date offsets
 * are drawn inside the job (crypto.getRandomValues) and never leave it or get saved.
 */
export type CohortDisclosureRequest =
  | { readonly kind: 'deidentified'; readonly dates: 'days-from-baseline' | 'shifted'; readonly maxShiftDays?: number }
  /** Only from an unlocked vault; the page logs the export before calling. */
  | { readonly kind: 'identified'; readonly identities: readonly Identity[] };

export interface CohortExportRequest {
  readonly records: CohortRecords;
  readonly filters: CohortFilters;
  readonly disclosure: CohortDisclosureRequest;
  readonly localMdc?: readonly LocalMdc[];
  readonly files?: readonly CohortFileKind[];
  /** ISO instant for the FHIR Bundle.timestamp. */
  readonly now?: string;
}

/** A summary group without functions, as it crosses to the page (charts: `changes`, `mdc`, `summary`). */
export type PlainGroupSummary = Omit<CohortGroupSummary, 'quantity'> & {
  readonly quantity: { readonly key: string; readonly label: string; readonly unit: string; readonly changeUnit: string; readonly betterWhen: string };
};

/** What the page learns before the files stream: counts, the summary and the files to come. */
export interface CohortExportPrepared {
  readonly count: CohortCount;
  readonly groups: readonly PlainGroupSummary[];
  readonly files: readonly { readonly kind: CohortFileKind; readonly fileName: string; readonly mediaType: string; readonly rows: number }[];
}

export interface CohortExportFileResult {
  readonly kind: CohortFileKind;
  readonly fileName: string;
  readonly mediaType: string;
  readonly rows: number;
  readonly blob: Blob;
}

export interface CohortExportResult extends CohortExportPrepared {
  readonly fileResults: readonly CohortExportFileResult[];
  /** Where it ran: a Web Worker, or the main thread when workers are unavailable or failed. */
  readonly ranOn: 'worker' | 'main-thread';
}

/** Why a job ended without files: cancelled by the user, refused input (`field` names it), or a failure. */
export class CohortExportFailure extends Error {
  override readonly name = 'CohortExportFailure';
  constructor(
    message: string,
    readonly reason: 'cancelled' | 'refused' | 'failed',
    readonly field: string | null = null,
  ) {
    super(message);
  }
}

/** A running export: progress through the callbacks, `result` at the end, `cancel()` at any time. */
export interface CohortExportJob {
  readonly result: Promise<CohortExportResult>;
  cancel(): void;
}

export interface CohortExportCallbacks {
  readonly onPrepared?: (prepared: CohortExportPrepared) => void;
  /** After every chunk (≈ 64 KiB): rows done and total, per file and overall. */
  readonly onProgress?: (progress: CohortExportProgress) => void;
}

// ---- Messages between the page and the worker ----

export type CohortWorkerRequest =
  | { readonly type: 'start'; readonly jobId: number; readonly request: CohortExportRequest }
  | { readonly type: 'cancel'; readonly jobId: number };

/** What a job reports (the worker adds the job id). */
export type CohortJobReply =
  | { readonly type: 'prepared'; readonly prepared: CohortExportPrepared }
  | { readonly type: 'progress'; readonly progress: CohortExportProgress }
  | { readonly type: 'done'; readonly fileResults: readonly CohortExportFileResult[] }
  | { readonly type: 'error'; readonly message: string; readonly reason: CohortExportFailure['reason']; readonly field: string | null };

export type CohortWorkerReply = CohortJobReply & { readonly jobId: number };

/** Cryptographic uniform in [0, 1) for date offsets (53 random bits). */
function cryptoUniform(): number {
  const words = crypto.getRandomValues(new Uint32Array(2));
  return ((words[0] as number) * 2 ** 21 + ((words[1] as number) >>> 11)) / 2 ** 53;
}

function toDisclosure(request: CohortDisclosureRequest): Disclosure {
  if (request.kind === 'identified') return { kind: 'identified', identities: request.identities };
  const keyBytes = crypto.getRandomValues(new Uint8Array(32));
  return {
    kind: 'deidentified',
    keyBytes,
    dates: request.dates === 'shifted' ? { kind: 'shifted', rng: cryptoUniform, maxShiftDays: request.maxShiftDays } : { kind: 'days-from-baseline' },
  };
}

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
      disclosure: toDisclosure(request.disclosure),
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

let worker: Worker | null = null;
let workerBroken = false;
let nextJobId = 1;
const jobs = new Map<number, (reply: CohortWorkerReply) => void>();

function startWorker(): Worker | null {
  if (worker) return worker;
  if (workerBroken || typeof Worker === 'undefined') return null;
  try {
    worker = new Worker(new URL('./cohort-export.worker.ts', import.meta.url), { type: 'module' });
  } catch {
    workerBroken = true;
    return null;
  }
  worker.onmessage = (event: MessageEvent<CohortWorkerReply>) => jobs.get(event.data.jobId)?.(event.data);
  worker.onerror = (event) => {
    // A broken worker fails its jobs; the next export runs on the main thread.
    for (const [jobId, handle] of jobs) handle({ type: 'error', jobId, message: event.message || 'the export worker failed', reason: 'failed', field: null });
    jobs.clear();
    worker?.terminate();
    worker = null;
    workerBroken = true;
  };
  return worker;
}

/**
 * Starts a cohort export in a Web Worker (falling back to the main thread where workers are
 * unavailable or broken). The page gets `onPrepared` (live count, summary per measure, files to
 * come), then `onProgress` after every chunk; `result` resolves with a Blob per file, or rejects
 * with CohortExportFailure ('cancelled', 'refused' with the field, or 'failed'). `cancel()` stops
 * the job between chunks.
 */
export function startCohortExport(request: CohortExportRequest, callbacks: CohortExportCallbacks = {}): CohortExportJob {
  const jobId = nextJobId++;
  let cancelled = false;
  let prepared: CohortExportPrepared | null = null;
  let settle!: { resolve: (r: CohortExportResult) => void; reject: (e: Error) => void };
  const result = new Promise<CohortExportResult>((resolve, reject) => (settle = { resolve, reject }));
  const target = startWorker();
  const ranOn = target ? 'worker' : 'main-thread';
  const handle = (reply: CohortJobReply) => {
    switch (reply.type) {
      case 'prepared':
        prepared = reply.prepared;
        callbacks.onPrepared?.(reply.prepared);
        return;
      case 'progress':
        callbacks.onProgress?.(reply.progress);
        return;
      case 'done':
        jobs.delete(jobId);
        if (prepared) settle.resolve({ ...prepared, fileResults: reply.fileResults, ranOn });
        else settle.reject(new CohortExportFailure('the export ended before it was prepared', 'failed'));
        return;
      case 'error':
        jobs.delete(jobId);
        settle.reject(new CohortExportFailure(reply.message, reply.reason, reply.field));
    }
  };
  if (target) {
    jobs.set(jobId, handle);
    const message: CohortWorkerRequest = { type: 'start', jobId, request };
    target.postMessage(message);
  } else {
    void runCohortExportJob(request, handle, () => cancelled);
  }
  return {
    result,
    cancel() {
      if (cancelled) return;
      cancelled = true;
      if (target && jobs.has(jobId)) {
        const message: CohortWorkerRequest = { type: 'cancel', jobId };
        target.postMessage(message);
      }
    },
  };
}

/** The live count on the main thread (build the index once, then countCohort per filter change); re-exported so the page imports one module. */
export { buildCohortIndex, countCohort };
