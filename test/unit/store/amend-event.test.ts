import { describe, expect, it } from 'vitest';
import { amendAssessment, setAssessmentDeleted, StoreError } from '../../../src/lib/store';
import { amendEvent } from '../../../src/lib/store/amend-event';
import { amendmentsOf, changedFields } from '../../../src/lib/store/amendments';
import { dumpAll, freshStore, seedPatient } from './store-helpers';

async function injection() {
  const store = await freshStore();
  const { patient, assessment } = await seedPatient(store);
  const event = await store.events.create({
    patientId: patient.id,
    kind: 'botulinum-toxin-injection',
    occurredOn: '2025-02-03',
    endsOn: null,
    side: 'left',
    summary: 'calf and hamstrings',
    muscles: 'gastrocnemius, soleus',
    dose: '200 units in total',
    notes: 'Invented note: well tolerated',
  });
  return { store, patient, assessment, event };
}

const errorOf = (p: Promise<unknown>) => p.then(() => null, (e: unknown) => e as StoreError);

describe('amendEvent', () => {
  it('corrects a mistyped date with one audit entry holding the reason and the old and new date', async () => {
    const { store, event } = await injection();
    const auditBefore = await store.audit.count();
    const result = await amendEvent(store, event.id, { expectedUpdatedAt: event.updatedAt, reason: 'date typed as February, was March', patch: { occurredOn: '2025-03-02' } });
    expect(result.changed).toBe(true);
    const stored = (await store.events.get(event.id))!;
    expect(stored.occurredOn).toBe('2025-03-02');
    // The sealed notes were not touched (no vault needed for the rest of the record).
    expect(stored.notesSealed).toEqual(event.notesSealed);
    expect((await store.events.open(stored)).notes).toBe('Invented note: well tolerated');

    const entries = await store.audit.recent((await store.audit.count()) - auditBefore);
    expect(entries).toHaveLength(1);
    const [entry] = entries;
    expect(entry!.action).toBe('update');
    expect(entry!.recordId).toBe(event.id);
    expect(entry!.note).toBe('amended: date typed as February, was March');
    expect((entry!.before as { occurredOn: string }).occurredOn).toBe('2025-02-03');
    expect((entry!.after as { occurredOn: string }).occurredOn).toBe('2025-03-02');
    expect(changedFields(entry!)).toEqual([{ field: 'occurredOn', before: '2025-02-03', after: '2025-03-02' }]);

    const amendments = await amendmentsOf(store, 'events', [event.id]);
    expect(amendments.get(event.id)).toEqual([{ at: entry!.createdAt, reason: 'date typed as February, was March', changes: [{ field: 'occurredOn', before: '2025-02-03', after: '2025-03-02' }] }]);
  });

  it('writes nothing for an empty reason, a stale form, an invalid change or a deleted event', async () => {
    const { store, event } = await injection();
    const before = await dumpAll(store);
    const empty = await errorOf(amendEvent(store, event.id, { expectedUpdatedAt: event.updatedAt, reason: '   ', patch: { occurredOn: '2025-03-02' } }));
    expect(empty?.code).toBe('ValidationFailed');
    expect(empty?.issues?.[0]?.path).toBe('reason');
    // An injection without its dose is refused whole, naming the field.
    const invalid = await errorOf(amendEvent(store, event.id, { expectedUpdatedAt: event.updatedAt, reason: 'dose moved to notes', patch: { dose: null } }));
    expect(invalid?.code).toBe('ValidationFailed');
    expect(invalid?.message).toMatch(/dose/);
    const endsBefore = await errorOf(amendEvent(store, event.id, { expectedUpdatedAt: event.updatedAt, reason: 'end date', patch: { endsOn: '2025-01-01' } }));
    expect(endsBefore?.code).toBe('ValidationFailed');
    expect(await dumpAll(store)).toEqual(before);

    // Changed on another tab after this form was opened: refused, the other change kept.
    await store.events.update(event.id, { summary: 'calf only' });
    const afterOther = await dumpAll(store);
    const stale = await errorOf(amendEvent(store, event.id, { expectedUpdatedAt: event.updatedAt, reason: 'date', patch: { occurredOn: '2025-03-02' } }));
    expect(stale?.code).toBe('VersionConflict');
    expect(await dumpAll(store)).toEqual(afterOther);

    const current = (await store.events.get(event.id))!;
    await store.events.remove(event.id, { expectedUpdatedAt: current.updatedAt });
    const afterDelete = await dumpAll(store);
    const gone = await errorOf(amendEvent(store, event.id, { expectedUpdatedAt: (await store.events.get(event.id))!.updatedAt, reason: 'date', patch: { occurredOn: '2025-03-02' } }));
    expect(gone?.code).toBe('NotFound');
    expect(await dumpAll(store)).toEqual(afterDelete);
  });

  it('an unchanged form writes nothing; a delete and its undo are audited but are not amendments', async () => {
    const { store, event } = await injection();
    const before = await dumpAll(store);
    const same = await amendEvent(store, event.id, { expectedUpdatedAt: event.updatedAt, reason: 'checked', patch: { occurredOn: '2025-02-03', dose: '200 units in total' } });
    expect(same.changed).toBe(false);
    expect(await dumpAll(store)).toEqual(before);

    await store.events.remove(event.id, { expectedUpdatedAt: event.updatedAt });
    await store.events.restore(event.id);
    const restored = (await store.events.get(event.id))!;
    expect(restored.deleted).toBe(false);
    // updatedAt moved (the old "changed since saved" test would mark it), yet it was never amended.
    expect(restored.updatedAt).not.toBe(restored.createdAt);
    expect((await amendmentsOf(store, 'events', [event.id])).has(event.id)).toBe(false);
    const actions = (await store.audit.forRecord('events', event.id)).map((e) => e.action);
    expect(actions).toEqual(['create', 'delete', 'restore']);
  });

  it('amends notes only while unlocked; the audit keeps the reason and a sealed marker, never the text', async () => {
    const { store, event } = await injection();
    store.vault.lock();
    const locked = await errorOf(amendEvent(store, event.id, { expectedUpdatedAt: event.updatedAt, reason: 'note', patch: { notes: 'Invented: swelling at site' } }));
    expect(locked?.code).toBe('Locked');
    await store.vault.unlock('correct horse battery');
    const result = await amendEvent(store, event.id, { expectedUpdatedAt: event.updatedAt, reason: 'note was incomplete', patch: { notes: 'Invented: swelling at site' } });
    expect(result.changed).toBe(true);
    expect((await store.events.open((await store.events.get(event.id))!)).notes).toBe('Invented: swelling at site');
    const entries = (await store.audit.forRecord('events', event.id)).filter((e) => e.note?.startsWith('amended: '));
    expect(entries).toHaveLength(1);
    expect(JSON.stringify(entries[0])).not.toMatch(/swelling|tolerated/);
    expect((entries[0]!.after as { notesSealed: unknown }).notesSealed).toBe('[sealed]');
  });
});

describe('the amended mark of a visit', () => {
  it('is set by an amendment (with its reason) and not by a delete and undo', async () => {
    const { store, assessment } = await injection();
    const fresh = (await store.assessments.get(assessment.id))!;
    await setAssessmentDeleted(store, assessment.id, true, { expectedUpdatedAt: fresh.updatedAt });
    await setAssessmentDeleted(store, assessment.id, false);
    expect((await amendmentsOf(store, 'assessments', [assessment.id])).size).toBe(0);
    const current = (await store.assessments.get(assessment.id))!;
    await amendAssessment(store, assessment.id, { expectedUpdatedAt: current.updatedAt, reason: 'setting was home', assessmentPatch: { setting: 'home' }, observations: [], formMeasures: [] });
    const marks = await amendmentsOf(store, 'assessments', [assessment.id]);
    expect(marks.get(assessment.id)?.map((a) => a.reason)).toEqual(['setting was home']);
    expect(marks.get(assessment.id)?.[0]?.changes).toEqual([{ field: 'setting', before: 'clinic', after: 'home' }]);
  });

  it('amends visit notes with the reason; unchanged notes are not sealed again', async () => {
    const { store, assessment } = await injection();
    const first = (await store.assessments.get(assessment.id))!;
    await amendAssessment(store, assessment.id, { expectedUpdatedAt: first.updatedAt, reason: 'pain score', assessmentPatch: { notes: 'Invented note: stiffer in the cold' }, observations: [], formMeasures: [] });
    const second = (await store.assessments.get(assessment.id))!;
    expect(second.notesSealed).toEqual(first.notesSealed);
    await amendAssessment(store, assessment.id, { expectedUpdatedAt: second.updatedAt, reason: 'note on the wrong visit', assessmentPatch: { notes: 'Invented: no change' }, observations: [], formMeasures: [] });
    const third = (await store.assessments.get(assessment.id))!;
    expect((await store.assessments.open(third)).notes).toBe('Invented: no change');
    const entries = (await store.audit.forRecord('assessments', assessment.id)).filter((e) => e.note?.startsWith('amended: '));
    expect(entries.map((e) => e.note)).toEqual(['amended: pain score', 'amended: note on the wrong visit']);
    expect(JSON.stringify(entries)).not.toMatch(/Invented/);
  });
});
