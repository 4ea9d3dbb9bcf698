import type { KinnoteStore } from './open-store';
import { settleCaseloadSummaries } from './caseload-summaries';
import { DRAFTS_TABLE, discardDraftInTransaction } from './drafts';
import type { Input, WriteOptions } from './repository';
import type { Row } from './rows';
import { toStoreError } from './store-error';
import { tableRows } from './table-rows';

/** An observation of the assessment; `traceIndex` points into the traces saved with it (or null). */
export type AssessmentObservationInput = Omit<Input<'observations'>, 'assessmentId' | 'traceId'> & {
  readonly traceIndex?: number | null;
};
export type AssessmentTraceInput = Omit<Input<'traces'>, 'assessmentId'>;

/**
 * Saves one assessment with its observations and raw traces in a single IndexedDB transaction:
 * everything is validated, stamped and audited first, and then either every record and audit entry
 * lands or none does (a full disk leaves nothing half-written). Observations get the assessment's id
 * and, through `traceIndex`, the id of their trace. Throws StoreError (ValidationFailed with issues
 * naming record and field, Locked for notes while locked, QuotaExceeded, Aborted). With
 * `options.draftId`, the form's draft is removed in that same transaction, so a saved assessment
 * never leaves a draft behind to be saved a second time after a crash.
 */
export async function saveAssessment(
  store: KinnoteStore,
  assessment: Input<'assessments'>,
  observations: readonly AssessmentObservationInput[],
  traces: readonly AssessmentTraceInput[] = [],
  options: WriteOptions = {},
): Promise<{ assessment: Row<'assessments'>; observations: Row<'observations'>[]; traces: Row<'traces'>[] }> {
  const a = await store.assessments.prepareCreate([assessment]);
  const assessmentRow = a.rows[0] as Row<'assessments'>;
  const assessmentId = (assessmentRow as { id: string }).id;
  const t = await store.traces.prepareCreate(traces.map((trace) => ({ ...trace, assessmentId })));
  const traceIds = t.rows.map((row) => (row as { id: string }).id);
  const o = await store.observations.prepareCreate(
    observations.map(({ traceIndex, ...obs }) => ({
      ...obs,
      assessmentId,
      traceId: traceIndex === null || traceIndex === undefined ? null : (traceIds[traceIndex] ?? null),
    })),
  );
  try {
    await store.db.transaction('rw', ['assessments', 'traces', 'observations', 'audit', DRAFTS_TABLE], async (tx) => {
      await store.db.table('assessments').add(assessmentRow);
      if (t.rows.length > 0) await store.db.table('traces').bulkAdd(t.rows);
      await tableRows(store.db, 'observations').add(o.rows);
      await store.db.table('audit').bulkAdd([...a.audits, ...t.audits, ...o.audits]);
      await discardDraftInTransaction(store.db, options.draftId);
      await settleCaseloadSummaries(store.db, tx);
    });
  } catch (error) {
    throw toStoreError(error, `saving the assessment with ${o.rows.length} observations`);
  }
  return { assessment: assessmentRow, observations: o.rows, traces: t.rows };
}
