import { describe, expect, it, vi } from 'vitest';
import { draftsFor, saveAssessment, writeDraft, type KinnoteStore } from '../../../src/lib/store';
import { DraftKeeper, type DraftEnvironment } from '../../../src/lib/ui/draft-keeper';
import { ordinalValue } from '../../../src/lib/domain';
import { emptyDraft } from '../../../src/lib/ui/assessment-draft';
import { visitDraftKeeper } from '../../../src/lib/ui/visit-draft';
import { freshStore } from '../store/store-helpers';

/** One browser tab: its own sessionStorage, a hand-driven timer queue, and a shared lock table. */
function tab(heldLocks: Set<string>, name: string) {
  const session = new Map<string, string>();
  const timers: Array<() => void> = [];
  let ids = 0;
  let clock = 1_000;
  const environment: DraftEnvironment = {
    sessionStorage: { getItem: (k) => session.get(k) ?? null, setItem: (k, v) => void session.set(k, v) },
    locks: {
      request: (async (lockName: string, _options: unknown, callback: (lock: unknown) => unknown) => {
        if (heldLocks.has(lockName)) return callback(null);
        heldLocks.add(lockName);
        return callback({ name: lockName });
      }) as unknown as LockManager['request'],
      query: async () => ({ held: [...heldLocks].map((n) => ({ name: n, mode: 'exclusive' as const, clientId: '' })), pending: [] }),
    },
    setTimeout: (fn) => timers.push(fn),
    clearTimeout: () => void timers.splice(0),
    now: () => (clock += 1000),
    randomId: () => `${name}-${++ids}`,
  };
  /** Fires the pending timer, as the browser would 250 ms later. */
  const tick = () => timers.splice(0).forEach((fn) => fn());
  return { environment, tick, close: () => [...heldLocks].filter((l) => l.includes(name)).forEach((l) => heldLocks.delete(l)) };
}

type Form = { grade: string };
function keeperFor(_store: KinnoteStore, environment: DraftEnvironment, subjectId: string) {
  return new DraftKeeper<Form>({ form: 'assessment', subjectId, environment, encode: (v) => v, decode: (c) => c as Form });
}

async function settle(keeper: DraftKeeper<Form>) {
  await keeper.flush();
}

describe('DraftKeeper', () => {
  it('writes the latest value once the timer fires, and restores it in the same tab', async () => {
    const store = await freshStore();
    const locks = new Set<string>();
    const a = tab(locks, 'a');
    const keeper = keeperFor(store, a.environment, 'p1');
    expect((await keeper.start(store)).restored).toBeNull();
    keeper.schedule({ grade: '1' });
    keeper.schedule({ grade: '1+' });
    expect(await draftsFor(store, 'assessment', 'p1')).toEqual([]);
    a.tick();
    await settle(keeper);
    expect((await draftsFor(store, 'assessment', 'p1')).map((d) => d.content)).toEqual([{ grade: '1+' }]);
    const again = await keeperFor(store, a.environment, 'p1').start(store);
    expect(again.restored?.value).toEqual({ grade: '1+' });
    expect(again.others).toEqual([]);
  });

  it('after a crash (new session, old tab gone) the one left-over draft is taken over and restored', async () => {
    const store = await freshStore();
    const locks = new Set<string>();
    const before = tab(locks, 'before');
    const k1 = keeperFor(store, before.environment, 'p1');
    await k1.start(store);
    k1.schedule({ grade: '2' });
    before.tick();
    await settle(k1);
    before.close();
    const after = tab(locks, 'after');
    const k2 = keeperFor(store, after.environment, 'p1');
    const start = await k2.start(store);
    expect(start.restored?.value).toEqual({ grade: '2' });
    expect(start.others).toEqual([]);
    expect((await draftsFor(store, 'assessment', 'p1')).map((d) => d.id)).toEqual([k2.id]);
  });

  it('two tabs keep two drafts; a second tab is offered the open one, never takes it silently', async () => {
    const store = await freshStore();
    const locks = new Set<string>();
    const a = tab(locks, 'a');
    const b = tab(locks, 'b');
    const ka = keeperFor(store, a.environment, 'p1');
    await ka.start(store);
    ka.schedule({ grade: '3' });
    a.tick();
    await settle(ka);
    const kb = keeperFor(store, b.environment, 'p1');
    const start = await kb.start(store);
    expect(start.restored).toBeNull();
    expect(start.others.map((o) => [o.origin, o.value])).toEqual([['open-tab', { grade: '3' }]]);
    kb.schedule({ grade: '0' });
    b.tick();
    await settle(kb);
    const kept = await draftsFor(store, 'assessment', 'p1');
    expect(Object.fromEntries(kept.map((d) => [d.id, d.content]))).toEqual({ [ka.id!]: { grade: '3' }, [kb.id!]: { grade: '0' } });
  });

  it('a change marked "now" (an instrument reading) is written at once, not when the timer fires', async () => {
    // A page reloaded or closed within the delay lost a reading: the write begun at pagehide may never land.
    const store = await freshStore();
    const a = tab(new Set<string>(), 'a');
    const keeper = keeperFor(store, a.environment, 'p1');
    await keeper.start(store);
    keeper.schedule({ grade: '1' });
    keeper.schedule({ grade: '1 + reading' }, true);
    // The timer never fires here: only a write started at once can land.
    await vi.waitFor(async () => expect((await draftsFor(store, 'assessment', 'p1')).map((d) => d.content)).toEqual([{ grade: '1 + reading' }]));
  });

  it('the visit draft keeps a reading it cannot read as stored, and names it on restore', async () => {
    const store = await freshStore();
    const a = tab(new Set<string>(), 'a');
    const broken = { key: 'r1', title: 'Pendulum from a file, left knee: R2 1.66', instrument: 'pendulum-file', observations: [], skipped: [], trace: { startedAt: '2026-12-03T12:00:00.000Z', channels: [{ name: 'knee', unit: 'deg' }] } };
    const { notes: _notes, ...form } = emptyDraft('p1', '');
    await writeDraft(store, { form: 'assessment', subjectId: 'p1', tabId: 'gone', savedAtMs: 5, content: { draft: form, sealedNotes: null, readings: [broken] } });
    const k1 = visitDraftKeeper({ patientId: 'p1', amendId: null, vault: () => null, onSealed: () => {}, onError: (e) => { throw e; }, environment: a.environment });
    const start = await k1.start(store);
    expect(start.restored?.value.readings).toEqual([]);
    expect(start.restored?.value.unreadable.map((u) => [u.name, u.problem])).toEqual([['Pendulum from a file, left knee: R2 1.66', 'channel 1 has no sample list']]);
    // Written again (the person typed on): the unreadable reading is still in the draft, unchanged.
    k1.schedule(start.restored!.value);
    a.tick();
    await k1.flush();
    const rows = await draftsFor(store, 'assessment', 'p1');
    expect(rows.map((r) => [r.id, (r.content as { readings: unknown[] }).readings])).toEqual([[k1.id, [broken]]]);
  });

  it('a save with the keeper paused removes the draft, and no late write brings it back', async () => {
    const store = await freshStore();
    const patient = await store.patients.create({ code: 'K7QM-3XHD', birthYear: 1970, condition: 'stroke', affectedSides: ['left'], status: 'active' });
    const locks = new Set<string>();
    const a = tab(locks, 'a');
    const keeper = keeperFor(store, a.environment, patient.id);
    await keeper.start(store);
    keeper.schedule({ grade: '2' });
    a.tick();
    await settle(keeper);
    keeper.schedule({ grade: '3' }); // pending when Save is pressed
    await keeper.pause();
    await saveAssessment(
      store,
      { patientId: patient.id, assessorId: store.actor!.clinicianId, performedAt: '2025-03-02T10:00:00.000Z', setting: 'home', conditions: { position: null, minutesSinceMedication: null, painNrs: null }, notes: null },
      [{ patientId: patient.id, takenAt: '2025-03-02T10:00:00.000Z', measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: ordinalValue('mas', '3') }],
      [],
      { draftId: keeper.id },
    );
    keeper.stop();
    a.tick();
    await keeper.flush();
    expect(await draftsFor(store, 'assessment', patient.id)).toEqual([]);
  });

  it('values typed while a save runs become the new draft once the save removed the old one', async () => {
    const store = await freshStore();
    const patient = await store.patients.create({ code: 'K7QM-3XHD', birthYear: 1970, condition: 'stroke', affectedSides: ['left'], status: 'active' });
    const locks = new Set<string>();
    const a = tab(locks, 'a');
    const keeper = keeperFor(store, a.environment, patient.id);
    await keeper.start(store);
    keeper.schedule({ grade: '2' });
    a.tick();
    await settle(keeper);
    await keeper.pause();
    keeper.schedule({ grade: '2, then typed during the save' });
    await saveAssessment(
      store,
      { patientId: patient.id, assessorId: store.actor!.clinicianId, performedAt: '2025-03-02T10:00:00.000Z', setting: 'home', conditions: { position: null, minutesSinceMedication: null, painNrs: null }, notes: null },
      [{ patientId: patient.id, takenAt: '2025-03-02T10:00:00.000Z', measureCode: 'mas', siteCode: 'elbow-flexors', side: 'left', mode: null, instrument: null, value: ordinalValue('mas', '2') }],
      [],
      { draftId: keeper.id },
    );
    // The save's transaction removed the draft; what the form shows now is kept again at once.
    await keeper.continueAfterSave({ grade: '2, then typed during the save' });
    expect((await draftsFor(store, 'assessment', patient.id)).map((d) => [d.id, d.content])).toEqual([[keeper.id, { grade: '2, then typed during the save' }]]);
    // Writing goes on after the save (the form stays open).
    keeper.schedule({ grade: '4' });
    a.tick();
    await settle(keeper);
    expect((await draftsFor(store, 'assessment', patient.id)).map((d) => d.content)).toEqual([{ grade: '4' }]);
  });

  it('nothing typed during the save: no draft comes back after it, and later typing is kept', async () => {
    const store = await freshStore();
    const locks = new Set<string>();
    const a = tab(locks, 'a');
    const keeper = keeperFor(store, a.environment, 'p1');
    await keeper.start(store);
    keeper.schedule({ grade: '1' });
    await keeper.pause();
    await keeper.continueAfterSave(null);
    a.tick();
    await settle(keeper);
    expect(await draftsFor(store, 'assessment', 'p1')).toEqual([]);
    keeper.schedule({ grade: '1+' });
    a.tick();
    await settle(keeper);
    expect((await draftsFor(store, 'assessment', 'p1')).map((d) => d.content)).toEqual([{ grade: '1+' }]);
  });

  it('a duplicated tab (sessionStorage copied) gets its own tab id', async () => {
    const store = await freshStore();
    const locks = new Set<string>();
    const a = tab(locks, 'a');
    const ka = keeperFor(store, a.environment, 'p1');
    await ka.start(store);
    const copy = tab(locks, 'copy');
    copy.environment.sessionStorage!.setItem('kinnote.tab-id', a.environment.sessionStorage!.getItem('kinnote.tab-id')!);
    const kc = keeperFor(store, copy.environment, 'p1');
    await kc.start(store);
    expect(kc.id).not.toBe(ka.id);
  });
});
