import type { KinnoteStore } from './open-store';
import { CHANGED_ELSEWHERE } from './repository';
import { StoreError, toStoreError } from './store-error';

/**
 * Deletes (soft: tombstones) or restores one assessment together with its observations and traces,
 * in one transaction: either every record changes, each with its audit entry, or none does. Undo is
 * the same call with `deleted: false`. With `expectedUpdatedAt` (the assessment's, as the caller read
 * it), a stale call is refused as VersionConflict and nothing changes. Throws StoreError (NotFound,
 * VersionConflict, QuotaExceeded, Aborted, …).
 */
export async function setAssessmentDeleted(
  store: KinnoteStore,
  assessmentId: string,
  deleted: boolean,
  options: { expectedUpdatedAt?: string } = {},
): Promise<{ changed: number }> {
  const assessment = await store.assessments.get(assessmentId);
  if (!assessment) throw new StoreError('NotFound', `assessment ${assessmentId} not found`);
  const expectedUpdatedAt = options.expectedUpdatedAt;
  if (expectedUpdatedAt !== undefined && expectedUpdatedAt !== (assessment as { updatedAt: string }).updatedAt) {
    throw new StoreError('VersionConflict', `assessment ${assessmentId}: ${CHANGED_ELSEWHERE}`);
  }
  const patientId = (assessment as { patientId: string }).patientId;
  let changed = 0;
  try {
    // The repositories' own transactions nest inside this one (same tables, read-write), so the
    // whole change commits or rolls back together. No Web Crypto runs here (tombstones only).
    await store.db.transaction('rw', ['assessments', 'observations', 'traces', 'audit'], async () => {
      const observations = (await store.observations.byPatient(patientId, { includeDeleted: true })).filter(
        (o) => o.assessmentId === assessmentId && o.deleted !== deleted,
      );
      const traces = (await store.traces.byPatient(patientId, { includeDeleted: true })).filter(
        (t) => t.assessmentId === assessmentId && t.deleted !== deleted,
      );
      for (const o of observations) await (deleted ? store.observations.remove(o.id) : store.observations.restore(o.id));
      for (const t of traces) await (deleted ? store.traces.remove(t.id) : store.traces.restore(t.id));
      if ((assessment as { deleted: boolean }).deleted !== deleted) {
        await (deleted ? store.assessments.remove(assessmentId, { expectedUpdatedAt }) : store.assessments.restore(assessmentId, { expectedUpdatedAt }));
        changed++;
      }
      changed += observations.length + traces.length;
    });
  } catch (error) {
    throw toStoreError(error, `${deleted ? 'deleting' : 'restoring'} assessment ${assessmentId}`);
  }
  return { changed };
}
