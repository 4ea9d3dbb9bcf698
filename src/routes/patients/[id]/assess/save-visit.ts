import { amendAssessment, saveAssessment, writeLocalState, type KinnoteStore } from '$lib/store';
import { VISIT_MESSAGES as M, draftConditions, type AssessmentDraft, type ObservationDraft, protocolFromDraft, protocolStateKey, VISIT_FORM_MEASURES, type KeptProtocol, readingSaveInputs, type VisitReading } from '$lib/ui';

/**
 * Saves a new visit: the form's observations and the instrument readings taken in it, with their
 * traces, in one transaction (all or nothing, each record audited) that also removes the draft. Then
 * keeps the protocol for next time (device-local; if that write fails the next visit lays out the
 * tests as recorded instead: nothing is lost).
 */
export async function saveNewVisit(
  store: KinnoteStore,
  input: { patientId: string; draft: AssessmentDraft; observations: readonly ObservationDraft[]; readings: readonly VisitReading[]; draftId: string | null },
): Promise<void> {
  const actor = store.actor;
  if (!actor) throw new Error(M.notSetUp);
  const { patientId, draft } = input;
  const performedAt = new Date(draft.performedAtLocal).toISOString();
  const fromReadings = readingSaveInputs(input.readings, patientId, performedAt);
  const saved = await saveAssessment(
    store,
    { patientId, assessorId: actor.clinicianId, performedAt, setting: draft.setting, conditions: draftConditions(draft), notes: draft.notes.trim() === '' ? null : draft.notes.trim() },
    [...input.observations.map((o) => ({ ...o, patientId, takenAt: performedAt, traceIndex: null })), ...fromReadings.observations],
    fromReadings.traces,
    { draftId: input.draftId },
  );
  const kept: KeptProtocol = { afterAssessmentId: saved.assessment.id, tests: protocolFromDraft(draft, input.readings) };
  await writeLocalState(store, protocolStateKey(patientId), kept).catch(() => undefined);
}

/**
 * Saves an amendment of a visit's form values with its reason (readings stay as saved). Notes are changed
 * only when `notes` is given (they were read, names unlocked): a locked form never blanks them.
 */
export async function saveAmendment(
  store: KinnoteStore,
  input: { amendId: string; expectedUpdatedAt: string; reason: string; draft: AssessmentDraft; observations: readonly ObservationDraft[]; draftId: string | null; notes?: string | null },
): Promise<void> {
  const { draft } = input;
  await amendAssessment(
    store,
    input.amendId,
    {
      expectedUpdatedAt: input.expectedUpdatedAt,
      reason: input.reason,
      assessmentPatch: {
        performedAt: new Date(draft.performedAtLocal).toISOString(),
        setting: draft.setting,
        conditions: draftConditions(draft),
        ...(input.notes === undefined ? {} : { notes: input.notes }),
      },
      observations: input.observations,
      formMeasures: VISIT_FORM_MEASURES,
    },
    { draftId: input.draftId },
  );
}
