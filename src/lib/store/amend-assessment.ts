import { amendmentNote } from './amendments';
import { settleCaseloadSummaries } from './caseload-summaries';
import type { KinnoteStore } from './open-store';
import { DRAFTS_TABLE, discardDraftInTransaction } from './drafts';
import type { Input, Patch, PreparedChange, WriteOptions } from './repository';
import type { Row } from './rows';
import { StoreError, toStoreError } from './store-error';
import { tableRows } from './table-rows';

/** One observation as the amended visit should hold it (matched to the stored ones by series). */
export type AmendedObservation = Pick<Input<'observations'>, 'measureCode' | 'siteCode' | 'side' | 'mode' | 'instrument' | 'value'>;

const seriesOf = (o: Pick<AmendedObservation, 'measureCode' | 'siteCode' | 'side' | 'mode'>) => `${o.measureCode}|${o.siteCode}|${o.side}|${o.mode ?? ''}`;
const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

/**
 * Amends a saved visit with a reason: the assessment's fields in `assessmentPatch` (with `notes`
 * only when the vault is unlocked: Locked otherwise; the audit keeps notes as a sealed marker, never
 * their text), and its form
 * observations brought to `observations` (matched by measure, site, side and mode: a changed value
 * or instrument is an update, a missing one a tombstone, a new one a create). Observations of other
 * measures (`keepMeasures`, e.g. pendulum indices with their traces) are never touched. Every
 * change is audited with its before and after and the note "amended: <reason>", and everything is
 * written in one transaction or nothing is. `expectedUpdatedAt` is the assessment's updatedAt when
 * the form was opened: VersionConflict when it changed since. Throws StoreError (ValidationFailed
 * for an empty reason or bad values, VersionConflict, NotFound, QuotaExceeded).
 */
export async function amendAssessment(
  store: KinnoteStore,
  assessmentId: string,
  change: {
    readonly expectedUpdatedAt: string;
    readonly reason: string;
    readonly assessmentPatch: Patch<'assessments'>;
    readonly observations: readonly AmendedObservation[];
    readonly formMeasures: readonly string[];
  },
  options: WriteOptions = {},
): Promise<{ changed: number }> {
  const note = amendmentNote(change.reason, `assessments ${assessmentId}`);
  const current = await store.assessments.get(assessmentId);
  if (!current || current.deleted) throw new StoreError('NotFound', `assessments ${assessmentId} not found`);
  const performedAt = change.assessmentPatch.performedAt ?? current.performedAt;
  // Notes are sealed, and the audit holds only a marker for them: unchanged text is not sealed again.
  let patch = change.assessmentPatch;
  if ('notes' in patch && (await store.assessments.open(current)).notes === (patch.notes ?? null)) {
    const { notes: _unchanged, ...rest } = patch;
    patch = rest;
  }
  const assessmentChange = await store.assessments.prepareChange(assessmentId, 'update', patch, { expectedUpdatedAt: change.expectedUpdatedAt }, note);

  const stored = (await store.observations.byPatient(current.patientId)).filter((o) => o.assessmentId === assessmentId && change.formMeasures.includes(o.measureCode));
  const wanted = new Map(change.observations.map((o) => [seriesOf(o), o]));
  const updates: PreparedChange<'observations'>[] = [];
  const storedKeys = new Set<string>();
  for (const o of stored) {
    const key = seriesOf(o);
    storedKeys.add(key);
    const next = wanted.get(key);
    if (!next) updates.push(await store.observations.prepareChange(o.id, 'delete', {}, {}, note));
    else if (!same(next.value, o.value) || next.instrument !== o.instrument || o.takenAt !== performedAt) {
      updates.push(await store.observations.prepareChange(o.id, 'update', { value: next.value, instrument: next.instrument, takenAt: performedAt }, {}, note));
    }
  }
  const fresh = change.observations.filter((o) => !storedKeys.has(seriesOf(o)));
  const created = await store.observations.prepareCreate(fresh.map((o) => ({ ...o, patientId: current.patientId, assessmentId, takenAt: performedAt, traceId: null })));
  const createAudits = created.audits.map((a) => ({ ...a, note }));
  // Pendulum and other instrument observations keep the visit's time too.
  const others = (await store.observations.byPatient(current.patientId)).filter((o) => o.assessmentId === assessmentId && !change.formMeasures.includes(o.measureCode) && o.takenAt !== performedAt);
  for (const o of others) updates.push(await store.observations.prepareChange(o.id, 'update', { takenAt: performedAt }, {}, note));

  try {
    await store.db.transaction('rw', ['assessments', 'observations', 'audit', DRAFTS_TABLE], async (tx) => {
      await store.assessments.writePrepared(assessmentChange);
      for (const u of updates) await store.observations.writePrepared(u);
      await tableRows(store.db, 'observations').add(created.rows as Row<'observations'>[]);
      if (createAudits.length > 0) await store.db.table('audit').bulkAdd(createAudits);
      await discardDraftInTransaction(store.db, options.draftId);
      await settleCaseloadSummaries(store.db, tx);
    });
  } catch (error) {
    throw toStoreError(error, `amending assessment ${assessmentId}`);
  }
  return { changed: updates.length + created.rows.length };
}
