import type { CohortCount, CohortDisclosureRequest, CohortExportProgress, CohortFileKind, CohortFilters, CohortGroupSummary, CohortRecords, LocalMdc } from '$lib/export';

// Vocabulary shared by the page's client, the job and the worker: requests, results, messages.

export type { CohortDisclosureRequest };

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
