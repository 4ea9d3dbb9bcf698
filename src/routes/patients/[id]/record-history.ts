// The patient page's second loader: what the lists of visits and events show beside each record.
import { type KinnoteStore, amendmentsOf, type Amendment } from '$lib/store';

export interface RecordHistory {
  /** Saved pendulum recordings by the visit that holds them (ids only; the samples stay in the store). */
  readonly swingsByAssessment: ReadonlyMap<string, readonly string[]>;
  /** Amendments of visits and events, from the audit: a record with an entry is marked "amended". */
  readonly visitAmendments: ReadonlyMap<string, readonly Amendment[]>;
  readonly eventAmendments: ReadonlyMap<string, readonly Amendment[]>;
}

export async function loadRecordHistory(store: KinnoteStore, patientId: string, visitIds: readonly string[], eventIds: readonly string[]): Promise<RecordHistory> {
  const swings = new Map<string, string[]>();
  for (const t of await store.traces.byPatient(patientId)) {
    if (t.kind !== 'pendulum-knee-angle' || !t.assessmentId) continue;
    swings.set(t.assessmentId, [...(swings.get(t.assessmentId) ?? []), t.id]);
  }
  const [visitAmendments, eventAmendments] = await Promise.all([amendmentsOf(store, 'assessments', visitIds), amendmentsOf(store, 'events', eventIds)]);
  return { swingsByAssessment: swings, visitAmendments, eventAmendments };
}
