import type { Assessment, Observation, Patient } from '$lib/domain';
import { readLocalState, type KinnoteStore, amendmentsOf } from '$lib/store';
import { VISIT_MESSAGES as M, emptyDraft, type AssessmentDraft, chooseProtocol, draftFromProtocol, draftFromVisit, lastObservations, protocolStateKey, type KeptProtocol } from '$lib/ui';

export interface VisitFormStart {
  readonly lastBySeries: Map<string, Observation>;
  /** No live visit before this one (amending: before the amended visit). */
  readonly firstVisit: boolean;
  /** The form as laid out: the saved visit (amending) or the patient's protocol (a new visit). */
  readonly laidOut: AssessmentDraft;
  readonly amendedUpdatedAt: string;
  readonly amendHistory: Array<{ at: string; note: string }>;
}

/** The patient (redacted), or null when not on this device. */
export async function loadPatient(store: KinnoteStore, patientId: string): Promise<Patient | null> {
  const row = await store.patients.get(patientId);
  return row ? (store.patients.redact(row) as Patient | null) : null;
}

/**
 * Everything the visit form starts from: last time's values, and the tests laid out. Amending, the
 * saved visit's values (and "last time" from before it); else the patient's visit protocol. Throws
 * when the visit to amend is not on this device.
 */
export async function loadVisitForm(store: KinnoteStore, patientId: string, amendId: string | null, performedAtLocal: string): Promise<VisitFormStart> {
  const [assessmentRows, observationRows, kept] = await Promise.all([
    store.assessments.byPatient(patientId),
    store.observations.byPatient(patientId),
    readLocalState(store, protocolStateKey(patientId)) as Promise<KeptProtocol | undefined>,
  ]);
  const visits = assessmentRows.map((a) => store.assessments.redact(a)).filter((a): a is Assessment => a !== null);
  const observations = observationRows as Observation[];
  const amended = amendId ? visits.find((a) => a.id === amendId && !a.deleted) : undefined;
  if (amendId && !amended) throw new Error(M.visitNotHere);
  // Amending: "last time" is the visit before the amended one (its own values are not compared with themselves).
  const before = (iso: string) => !amended || Date.parse(iso) < Date.parse(amended.performedAt);
  const lastBySeries = lastObservations(observations.filter((o) => before(o.takenAt)));
  const firstVisit = !visits.some((a) => !a.deleted && a.id !== amended?.id && before(a.performedAt));
  if (!amended) {
    const laidOut = draftFromProtocol(patientId, performedAtLocal, chooseProtocol(kept, visits, observations), emptyDraft(patientId, performedAtLocal));
    return { lastBySeries, firstVisit, laidOut, amendedUpdatedAt: '', amendHistory: [] };
  }
  // The one reading of "amended" (store/amendments.ts), shared with the patient page's mark.
  const amendHistory = ((await amendmentsOf(store, 'assessments', [amended.id])).get(amended.id) ?? []).map((a) => ({ at: a.at, note: a.reason }));
  return { lastBySeries, firstVisit, laidOut: draftFromVisit(amended, observations, emptyDraft(patientId, '')), amendedUpdatedAt: amended.updatedAt, amendHistory };
}
