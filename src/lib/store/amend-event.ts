import { amendmentNote } from './amendments';
import { settleCaseloadSummaries } from './caseload-summaries';
import type { KinnoteStore } from './open-store';
import type { Patch } from './repository';
import type { Row } from './rows';
import { StoreError, toStoreError } from './store-error';

/**
 * Amends a saved event (an intervention) with a reason: `patch` holds the fields as the form has
 * them now. The change is validated whole (an injection still needs muscles and dose), written with
 * one audit entry carrying the old and new record and the note "amended: <reason>", in one
 * transaction or not at all. `expectedUpdatedAt` is the event's updatedAt when the form was opened:
 * VersionConflict when it changed since. A patch that changes nothing writes nothing
 * (`changed: false`). Notes are protected: a patch with `notes` needs the vault unlocked (Locked).
 * Throws StoreError (ValidationFailed for an empty reason or bad fields, NotFound for a missing or
 * deleted event, VersionConflict, Locked, QuotaExceeded).
 */
export async function amendEvent(
  store: KinnoteStore,
  eventId: string,
  change: { readonly expectedUpdatedAt: string; readonly reason: string; readonly patch: Patch<'events'> },
): Promise<{ changed: boolean; event: Row<'events'> }> {
  const note = amendmentNote(change.reason, `events ${eventId}`);
  const current = await store.events.get(eventId);
  if (!current || current.deleted) throw new StoreError('NotFound', `events ${eventId} not found`);
  const prepared = await store.events.prepareChange(eventId, 'update', change.patch, { expectedUpdatedAt: change.expectedUpdatedAt }, note);
  const before = prepared.audit.before ?? {};
  const after = prepared.audit.after ?? {};
  const differs = Object.keys(after).some((k) => k !== 'updatedAt' && k !== 'deviceId' && k !== 'clinicianId' && JSON.stringify(before[k]) !== JSON.stringify(after[k]));
  // Notes re-sealed with the same text look alike in the audit (a marker): compare them in clear.
  const notesChanged = 'notes' in change.patch && (await store.events.open(current)).notes !== (change.patch.notes ?? null);
  if (!differs && !notesChanged) return { changed: false, event: current };
  try {
    await store.db.transaction('rw', ['events', 'audit'], async (tx) => {
      await store.events.writePrepared(prepared);
      await settleCaseloadSummaries(store.db, tx);
    });
  } catch (error) {
    throw toStoreError(error, `amending event ${eventId}`);
  }
  return { changed: true, event: prepared.row };
}
