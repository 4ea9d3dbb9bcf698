// Schema 6 → 7 (issue 13): phone pendulum recordings saved by the older analysis are analysed again.
// The database is built at version 6 exactly as the older app left it (phone-reanalysis-fixture.ts). The
// recordings come from the independent simulator, so the corrected values are checked against the
// simulated leg, not against the code under test.
import { describe, expect, it } from 'vitest';
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import { validateRecord, type ObservationValue } from '../../../src/lib/domain';
import { motionTraceChannels, reanalyseSavedRecording } from '../../../src/lib/sensors';
import { LATEST_SCHEMA_VERSION, dismissPhoneReanalysisNotice, openStore, readPhoneReanalysisNotice } from '../../../src/lib/store';
import { REANALYSIS_CHANGED_NOTE, REANALYSIS_FLAGGED_NOTE } from '../../../src/lib/store/phone-reanalysis';
import { runPendingPhoneReanalysis } from '../../../src/lib/store/phone-reanalysis-run';
import { OLD_VALUES, actor, buildV6, ids, stamps, type Name } from './phone-reanalysis-fixture';

const valueOf = (v: ObservationValue) => ('value' in v ? v.value : 'angleDeg' in v ? v.angleDeg : NaN);

describe('schema 6 → 7: saved phone recordings re-analysed with the corrected axis order and hand-held start', () => {
  it('updates only changed values (within the goal figures of the simulated legs), audits each with before/after and reason, flags a refusal, and leaves one notice', async () => {
    const factory = new IDBFactory();
    const { sims, observationIds } = await buildV6({ indexedDB: factory, IDBKeyRange });
    let clock = Date.UTC(2026, 11, 3, 9);
    const store = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null, now: () => (clock += 1000) });
    expect(store.db.verno).toBe(LATEST_SCHEMA_VERSION);
    const auditBefore = await store.audit.count();
    const notice = await runPendingPhoneReanalysis(store, reanalyseSavedRecording);

    // Extension-type leg: every value the older analysis saved was off; each is now the simulated leg's
    // within the goal figures (R2 ±0.10, A1 ±3°, rest ±(2° + tilt), peaks ±1).
    const byId = async (id: string) => (await store.observations.get(id))!;
    const check = async (name: Name) => {
      const truth = sims[name].truth;
      const tilt = sims[name].case.tiltDeg;
      const out: Record<string, number> = {};
      for (const o of await store.observations.byPatient(ids(1))) if (o.traceId === ids(20 + (Object.keys(OLD_VALUES) as Name[]).indexOf(name))) out[o.measureCode] = valueOf(o.value);
      if ('pendulum-ri' in out) expect(Math.abs(out['pendulum-ri']! - truth.r2), `${name} R2`).toBeLessThan(0.1);
      expect(Math.abs(out['pendulum-first-swing']! - truth.a1Deg), `${name} A1`).toBeLessThan(3);
      expect(Math.abs(out['pendulum-resting-angle']! - truth.restDeg), `${name} rest`).toBeLessThan(2 + tilt);
      expect(Math.abs(out['pendulum-swing-count']! - truth.peakCount), `${name} peaks`).toBeLessThanOrEqual(1);
      return out;
    };
    await check('extension');
    const unaffected = await check('unaffected');
    // R2 and normalised R2, left out by the older analysis (4.19 is out of range), are added.
    expect(unaffected['pendulum-ri']).toBeDefined();
    expect(unaffected['pendulum-ri-normalised']).toBeDefined();

    // One audit entry per changed observation, with old and new value and the reason.
    const changedIds = [...observationIds.extension, ...observationIds.unaffected.slice(0, 2)];
    for (const id of changedIds) {
      const history = await store.audit.forRecord('observations', id);
      const entries = history.filter((e) => e.note === REANALYSIS_CHANGED_NOTE);
      expect(entries, id).toHaveLength(1);
      const entry = entries[0]!;
      expect(entry.action).toBe('update');
      const oldValue = Object.values(OLD_VALUES).flat()[[...observationIds.extension, ...observationIds.unaffected, ...observationIds.stuckAccelerometer].indexOf(id)]![1];
      expect(entry.before?.value).toEqual(oldValue);
      expect(entry.after?.value).toEqual((await byId(id)).value);
      expect(entry.after?.value).not.toEqual(oldValue);
      expect(entry.clinicianId).toBe(actor.clinicianId);
      expect(validateRecord('observations', await byId(id)).ok).toBe(true);
    }
    // Where the value did not change (the unaffected leg's swing count: 10 before and after), nothing is written.
    const unchanged = observationIds.unaffected[2]!;
    expect((await byId(unchanged)).value).toEqual({ kind: 'count', value: 10 });
    expect((await byId(unchanged)).updatedAt).toBe(stamps.updatedAt);
    expect(await store.audit.forRecord('observations', unchanged)).toEqual([]);

    // The refused recording keeps its values, each flagged in the audit with the reason.
    for (const [j, id] of observationIds.stuckAccelerometer.entries()) {
      const row = await byId(id);
      expect(row.value).toEqual(OLD_VALUES.stuckAccelerometer![j]![1]);
      expect(row.updatedAt).toBe(stamps.updatedAt);
      const history = await store.audit.forRecord('observations', id);
      expect(history).toHaveLength(1);
      expect(history[0]!.note).toMatch(new RegExp(`^${REANALYSIS_FLAGGED_NOTE.replace(/[.()]/g, '\\$&')} .*gyroscope and its gravity reading disagree`));
      expect(history[0]!.before).toEqual(history[0]!.after);
    }

    // Raw samples untouched; the derived angle replaced by the corrected one (checked against the simulated knee).
    const trace = (await store.traces.get(ids(20)))!;
    const rawBefore = motionTraceChannels(sims.extension.recording);
    for (const raw of rawBefore) expect(Array.from(trace.channels.find((c) => c.name === raw.name)!.samples)).toEqual(Array.from(raw.samples));
    const angle = trace.channels.find((c) => c.name === 'knee_flexion_deg')!.samples;
    const errors = Array.from(angle, (a, i) => Math.abs(a - sims.extension.angleDeg[i]!)).sort((a, b) => a - b);
    expect(errors[Math.floor(errors.length / 2)]).toBeLessThan(2 + sims.extension.case.tiltDeg);
    expect((await store.audit.forRecord('traces', ids(20))).map((e) => e.action)).toEqual(['update']);
    // The refused recording's trace and the file trace are left as they were.
    expect((await store.traces.get(ids(22)))!.updatedAt).toBe(stamps.updatedAt);
    expect((await store.traces.get(ids(30)))!.updatedAt).toBe(stamps.updatedAt);

    // The notice: how many recordings, which values changed, which were flagged and why.
    expect(notice).not.toBeNull();
    expect(notice!.recordings).toBe(3);
    expect(notice!.recordingsChanged).toBe(2);
    expect(notice!.changes).toHaveLength(changedIds.length + 2);
    expect(notice!.changes.filter((c) => c.before === null).map((c) => c.measureCode).sort()).toEqual(['pendulum-ri', 'pendulum-ri-normalised']);
    expect(notice!.flagged).toHaveLength(1);
    expect(notice!.flagged[0]).toMatchObject({ patientCode: 'K7QM-3XHD', measureCodes: ['pendulum-first-swing', 'pendulum-resting-angle', 'pendulum-swing-count'] });
    expect(await readPhoneReanalysisNotice(store)).toEqual(notice);
    const written = (await store.audit.count()) - auditBefore;
    // 7 changed, 2 added, 3 flagged observations; 2 traces whose derived angle was replaced.
    expect(written).toBe(changedIds.length + 2 + 3 + 2);
    store.close();

    // Next open: nothing runs again (marker gone), the notice shows until it is dismissed, then never.
    const again = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    expect(await runPendingPhoneReanalysis(again, reanalyseSavedRecording)).toBeNull();
    expect(await again.audit.count()).toBe(auditBefore + written);
    expect(await readPhoneReanalysisNotice(again)).toEqual(notice);
    await dismissPhoneReanalysisNotice(again);
    expect(await readPhoneReanalysisNotice(again)).toBeNull();
    again.close();
  }, 60_000);

  it('a database created at version 7 has nothing pending', async () => {
    const factory = new IDBFactory();
    const store = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null, actor });
    expect(await runPendingPhoneReanalysis(store, reanalyseSavedRecording)).toBeNull();
    store.close();
  });

  it('an analysis that throws flags that recording only; a crash part-way resumes without writing any recording twice', async () => {
    const factory = new IDBFactory();
    const { observationIds } = await buildV6({ indexedDB: factory, IDBKeyRange });
    const store = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    let calls = 0;
    // The second recording's analysis throws (a bug); the third closes the database, as a crash would.
    const faulty: typeof reanalyseSavedRecording = (trace, obs) => {
      calls++;
      if (calls === 2) throw new Error('out of memory');
      if (calls === 3) store.db.close();
      return reanalyseSavedRecording(trace, obs);
    };
    await expect(runPendingPhoneReanalysis(store, faulty)).rejects.toThrow();
    store.close();
    const again = await openStore({ indexedDB: factory, IDBKeyRange, kdfIterations: 1000, idleTimeoutMs: null });
    const notice = await runPendingPhoneReanalysis(again, reanalyseSavedRecording);
    // All three recordings counted once; the one whose analysis threw is flagged with that reason and
    // its values kept; the first was written once only, before the crash.
    expect(notice!.recordings).toBe(3);
    const reasons = notice!.flagged.map((f) => f.reason);
    expect(reasons).toHaveLength(2);
    expect(reasons).toContain('the re-analysis failed (out of memory)');
    expect(reasons.filter((r) => /gyroscope and its gravity reading disagree/.test(r))).toHaveLength(1);
    for (const id of observationIds.extension) expect((await again.audit.forRecord('observations', id)).length).toBe(1);
    for (const [j, id] of observationIds.unaffected.entries()) expect((await again.observations.get(id))!.value).toEqual(OLD_VALUES.unaffected![j]![1]);
    expect(await runPendingPhoneReanalysis(again, reanalyseSavedRecording)).toBeNull();
    again.close();
  }, 60_000);
});
