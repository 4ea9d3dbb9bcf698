import type { TableName } from '../domain';
import type { BundleHeader } from './backup-bundle';

export interface TableCounts {
  inserted: number;
  replaced: number;
  unchanged: number;
  keptLocal: number;
}

/** One record present on both sides with different content, and how it was settled. */
export interface MergeConflict {
  readonly table: TableName;
  readonly recordId: string;
  readonly localUpdatedAt: string;
  readonly incomingUpdatedAt: string;
  readonly winner: 'incoming' | 'local';
  /** 'newer': the winner's updatedAt is later; 'tie-break': same updatedAt, the larger canonical text wins (same on every device). */
  readonly reason: 'newer' | 'tie-break';
  /** True when an earlier import already recorded this very conflict (nothing new written). */
  readonly alreadyRecorded: boolean;
}

/** What an import did, for the user and the audit log. */
export interface MergeReport {
  readonly header: BundleHeader;
  readonly checksum: string;
  /** False when the bundle held nothing new (importing the same bundle twice). */
  readonly changed: boolean;
  readonly counts: Record<TableName, TableCounts>;
  readonly conflicts: readonly MergeConflict[];
  /** Exercise photos written and removed (photos are no records: they have no counts above). */
  readonly photos: { readonly written: number; readonly removed: number };
}

/** One planned write (row) or re-check (row undefined) of the write step. */
export interface Planned {
  readonly table: TableName;
  readonly id: string;
  /** updatedAt of the local row when planned (undefined: absent), re-checked inside the write transaction. */
  readonly localUpdatedAt: string | undefined;
  readonly row: unknown;
}

/** A conflict to be written to the audit log: the local copy before, the incoming one after. */
export interface ConflictAudit {
  readonly conflict: MergeConflict;
  readonly before: Record<string, unknown>;
  readonly after: Record<string, unknown>;
}
