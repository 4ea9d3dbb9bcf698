// The hand-off at store level: therapist's store → encrypted package → patient's phone → ticks
// and self-reports → encrypted report → therapist's store; with wrong, tampered, foreign and
// repeated files. Two separate fake IndexedDB factories stand for the two devices.
import { describe, expect, it } from 'vitest';
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import { openStore, type KinnoteStore } from '../../../src/lib/store';
import { EMPTY_DOSE, type HomeProgramme, type Patient } from '../../../src/lib/domain';
import {
  ProgrammeTransferError,
  acceptProgrammePackage,
  choosePatientMode,
  createHomeReport,
  createProgrammePackage,
  gatherHomeReport,
  importHomeReport,
  loadHomeLog,
  openProgrammePackage,
  planToProgrammeInput,
  readDeviceProfile,
  saveSelfReport,
  saveTick,
  type ExercisePlan,
} from '../../../src/lib/programme';
import { sealTransfer } from '../../../src/lib/programme/sealed-transfer';
import { freshStore, steppingClock, TEST_ITERATIONS } from '../store/store-helpers';

let seed = 1;
const randomBytes = (n: number) => Uint8Array.from({ length: n }, () => (seed = (seed * 48271) % 2147483647) & 255);
const sealing = { randomBytes, iterations: TEST_ITERATIONS };
const CODE = '7KQ2M-XD4PH';
const RETURN_CODE = 'H3JV9-2MZQA';

const plan: ExercisePlan = {
  title: 'Stretches at home',
  startsOn: '2025-03-03',
  endsOn: null,
  exercises: [
    { name: 'Calf stretch against a wall', dose: { ...EMPTY_DOSE, holdSeconds: 30, repetitions: 3, sets: 1, timesPerDay: 1, note: 'stop if it hurts' }, dosageText: '' },
    { name: 'Lie on your front', dose: { ...EMPTY_DOSE, durationMinutes: 10, daysPerWeek: 3 }, dosageText: '' },
    // Kept as the therapist wrote it: handed over and shown as written, never counted as planned.
    { name: 'Resting splint', dose: null, dosageText: 'nightly as tolerated' },
  ],
};

async function therapist(): Promise<{ store: KinnoteStore; patient: Patient; other: Patient; programme: HomeProgramme }> {
  const store = await freshStore({ now: steppingClock(Date.UTC(2025, 2, 1, 9)) });
  const patient = (await store.patients.create({ code: 'K7QM-3XHD', birthYear: 1961, condition: 'stroke', affectedSides: ['left'], status: 'active' })) as Patient;
  const other = (await store.patients.create({ code: 'B4TR-9WXE', birthYear: 1975, condition: 'multiple-sclerosis', affectedSides: [], status: 'active' })) as Patient;
  await store.identities.create({ patientId: patient.id, familyName: 'Invented', givenName: 'Alba', dateOfBirth: null, contact: null });
  await store.homeProgrammes.create({ ...planToProgrammeInput(plan, other.id), title: 'Someone else' });
  const programme = (await store.homeProgrammes.create(planToProgrammeInput(plan, patient.id))) as HomeProgramme;
  return { store, patient, other, programme };
}

async function patientPhone(): Promise<KinnoteStore> {
  const store = await openStore({ name: 'kinnote-phone', now: steppingClock(Date.UTC(2025, 2, 3, 8)), kdfIterations: TEST_ITERATIONS, idleTimeoutMs: null, indexedDB: new IDBFactory(), IDBKeyRange });
  await choosePatientMode(store);
  return store;
}

describe('programme package', () => {
  it('carries one programme under the pseudonymous code, and nothing else', async () => {
    const t = await therapist();
    const text = await createProgrammePackage({ patient: t.patient, programme: t.programme, issuedAt: '2025-03-01T10:00:00.000Z' }, CODE, sealing);
    expect(text).not.toContain('Stretches'); // encrypted
    const opened = await openProgrammePackage(text, ' 7kq2m xd4ph ');
    expect(opened.patient).toEqual({ id: t.patient.id, code: 'K7QM-3XHD' });
    expect(opened.plan).toEqual(plan);
    expect(JSON.stringify(opened)).not.toMatch(/Alba|Invented|B4TR|1961|stroke/);
    t.store.close();
  });

  it("carries the patient's language the therapist chose, and refuses one the phone cannot speak", async () => {
    const t = await therapist();
    const issuedAt = '2025-03-01T10:00:00.000Z';
    const spanish = await openProgrammePackage(await createProgrammePackage({ patient: t.patient, programme: t.programme, issuedAt, language: 'es' }, CODE, sealing), CODE);
    expect(spanish.language).toBe('es');
    expect(spanish.formatVersion).toBe(4);
    // None chosen: the phone keeps its own language.
    const none = await openProgrammePackage(await createProgrammePackage({ patient: t.patient, programme: t.programme, issuedAt }, CODE, sealing), CODE);
    expect(none.language).toBeUndefined();
    // A version-3 file (before languages) is still read.
    const v3 = await sealTransfer(JSON.stringify({ format: 'kinnote-home-programme', formatVersion: 3, issuedAt, patient: { id: t.patient.id, code: t.patient.code }, programme: t.programme }), CODE, sealing);
    expect((await openProgrammePackage(v3, CODE)).plan).toEqual(plan);
    const klingon = await sealTransfer(JSON.stringify({ format: 'kinnote-home-programme', formatVersion: 4, issuedAt, patient: { id: t.patient.id, code: t.patient.code }, programme: t.programme, language: 'tlh' }), CODE, sealing);
    await expect(openProgrammePackage(klingon, CODE)).rejects.toMatchObject({ code: 'Invalid', message: expect.stringContaining('language') });
    t.store.close();
  });

  it('refuses a wrong code, a tampered file, another kind of file, and extra content', async () => {
    const t = await therapist();
    const text = await createProgrammePackage({ patient: t.patient, programme: t.programme, issuedAt: '2025-03-01T10:00:00.000Z' }, CODE, sealing);
    await expect(openProgrammePackage(text, 'H3JV9-2MZQA')).rejects.toMatchObject({ code: 'WrongCode' });
    const envelope = JSON.parse(text) as { ciphertext: string };
    const flipped = envelope.ciphertext[10] === 'A' ? 'B' : 'A';
    const tampered = JSON.stringify({ ...envelope, ciphertext: envelope.ciphertext.slice(0, 10) + flipped + envelope.ciphertext.slice(11) });
    await expect(openProgrammePackage(tampered, CODE)).rejects.toMatchObject({ code: 'Tampered' });
    await expect(openProgrammePackage(text.slice(0, text.length / 2), CODE)).rejects.toMatchObject({ code: 'NotThisKind' });
    await expect(openProgrammePackage('{"hello":1}', CODE)).rejects.toMatchObject({ code: 'NotThisKind' });
    // A package made by hand that smuggles another patient's record in: refused whole.
    const smuggled = await sealTransfer(
      JSON.stringify({ format: 'kinnote-home-programme', formatVersion: 1, issuedAt: '2025-03-01T10:00:00.000Z', patient: { id: t.patient.id, code: t.patient.code }, programme: t.programme, patients: [t.other] }),
      CODE,
      sealing,
    );
    await expect(openProgrammePackage(smuggled, CODE)).rejects.toMatchObject({ code: 'Invalid' });
    // A programme of another patient under this patient's name: refused.
    const [otherProgramme] = (await t.store.homeProgrammes.byPatient(t.other.id)) as HomeProgramme[];
    const mixed = await sealTransfer(
      JSON.stringify({ format: 'kinnote-home-programme', formatVersion: 1, issuedAt: '2025-03-01T10:00:00.000Z', patient: { id: t.patient.id, code: t.patient.code }, programme: otherProgramme }),
      CODE,
      sealing,
    );
    await expect(openProgrammePackage(mixed, CODE)).rejects.toMatchObject({ code: 'ForeignPatient' });
    const future = await sealTransfer(JSON.stringify({ format: 'kinnote-home-programme', formatVersion: 5 }), CODE, sealing);
    await expect(openProgrammePackage(future, CODE)).rejects.toMatchObject({ code: 'Unsupported' });
    t.store.close();
  });
});

describe('round trip therapist → phone → therapist', () => {
  it('merges adherence and self-reports by id; the same report twice changes nothing; foreign and tampered reports write nothing', async () => {
    const t = await therapist();
    const phone = await patientPhone();
    const pkgText = await createProgrammePackage({ patient: t.patient, programme: t.programme, issuedAt: '2025-03-01T10:00:00.000Z' }, CODE, sealing);
    const pkg = await openProgrammePackage(pkgText, CODE, null);
    const accepted = await acceptProgrammePackage(phone, pkg, { now: () => Date.UTC(2025, 2, 3, 8), platform: 'test', today: '2025-03-03' });
    expect(accepted.merge.counts.homeProgrammes.inserted).toBe(1);
    const profile = await readDeviceProfile(phone);
    expect(profile).toMatchObject({ mode: 'patient', patientId: t.patient.id, patientCode: 'K7QM-3XHD', currentProgrammeId: t.programme.id });
    // The phone holds this patient's programme only: no patient record, no identity, nobody else.
    expect(await phone.patients.list({ includeDeleted: true })).toEqual([]);
    expect(await phone.identities.list({ includeDeleted: true })).toEqual([]);
    expect((await phone.homeProgrammes.list()).map((p) => p.id)).toEqual([t.programme.id]);

    // Week of 3 March through Sunday 9 March: exercise 0 daily (7 planned), done 5 days, partly 1, skipped 1.
    const days = ['2025-03-03', '2025-03-04', '2025-03-05', '2025-03-06', '2025-03-07', '2025-03-08', '2025-03-09'];
    const base = { programmeId: t.programme.id, slot: 1, recordedAt: '2025-03-09T18:00:00.000Z' };
    for (const [i, day] of days.entries()) {
      const status = i < 5 ? 'done' : i === 5 ? 'partly' : 'skipped';
      await saveTick(phone, t.patient.id, { ...base, exercise: 0, day, status, reason: status === 'skipped' ? 'visitors all day' : null }, '2025-03-09');
    }
    // Exercise 1 (3 a week): done twice.
    await saveTick(phone, t.patient.id, { ...base, exercise: 1, day: '2025-03-04', status: 'done', reason: null }, '2025-03-09');
    await saveTick(phone, t.patient.id, { ...base, exercise: 1, day: '2025-03-06', status: 'done', reason: null }, '2025-03-09');
    await saveSelfReport(phone, t.patient.id, '2025-03-09', 2, 5);
    await saveSelfReport(phone, t.patient.id, '2025-03-09', 1, 4); // same day: updated, not added
    expect((await loadHomeLog(phone)).log.ticks).toHaveLength(9);

    const gathered = await gatherHomeReport(phone, { patientId: t.patient.id, patientCode: 'K7QM-3XHD', deviceId: profile!.mode === 'patient' ? profile!.deviceId! : '' }, '2025-03-09', '2025-03-09T19:00:00.000Z');
    // Hand-worked: planned 7 + 3 = 10; done 5 + 2 = 7.
    expect(gathered.adherenceEntries.map((e) => [e.periodStart, e.sessionsPlanned, e.sessionsDone])).toEqual([['2025-03-03', 10, 7]]);
    expect(gathered.selfReports.map((s) => [s.reportedOn, s.spasmFrequencyPenn, s.spasmSeverityNrs])).toEqual([['2025-03-09', 1, 4]]);
    const reportText = await createHomeReport(gathered, RETURN_CODE, sealing);

    // The report reaches the therapist's tablet a week later (its stamps must not be in the tablet's future).
    Object.assign(t.store.context, { now: steppingClock(Date.UTC(2025, 2, 10, 9)) });
    // A wrong code, a tampered report and a report for another patient's page write nothing.
    const auditBefore = await t.store.audit.count();
    await expect(importHomeReport(t.store, reportText, CODE, t.patient)).rejects.toMatchObject({ code: 'WrongCode' });
    await expect(importHomeReport(t.store, reportText, RETURN_CODE, t.other)).rejects.toMatchObject({ code: 'ForeignPatient' });
    const envelope = JSON.parse(reportText) as { ciphertext: string };
    const c = envelope.ciphertext;
    const tampered = JSON.stringify({ ...envelope, ciphertext: c.slice(0, 40) + (c[40] === 'x' ? 'y' : 'x') + c.slice(41) });
    await expect(importHomeReport(t.store, tampered, RETURN_CODE, t.patient)).rejects.toBeInstanceOf(ProgrammeTransferError);
    expect(await t.store.audit.count()).toBe(auditBefore);
    expect(await t.store.adherenceEntries.byPatient(t.patient.id)).toEqual([]);

    const first = await importHomeReport(t.store, reportText, RETURN_CODE, t.patient);
    expect(first.merge.changed).toBe(true);
    expect(first.added).toBe(2);
    const entries = await t.store.adherenceEntries.byPatient(t.patient.id);
    expect(entries.map((e) => e.id)).toEqual(gathered.adherenceEntries.map((e) => e.id));
    const auditAfterFirst = await t.store.audit.count();
    const second = await importHomeReport(t.store, reportText, RETURN_CODE, t.patient);
    expect(second.merge.changed).toBe(false);
    expect(await t.store.audit.count()).toBe(auditAfterFirst);

    // One more tick, a later report: the same entry is replaced, not duplicated.
    await saveTick(phone, t.patient.id, { ...base, exercise: 1, day: '2025-03-08', status: 'done', reason: null }, '2025-03-09');
    const later = await createHomeReport(await gatherHomeReport(phone, { patientId: t.patient.id, patientCode: 'K7QM-3XHD', deviceId: profile!.mode === 'patient' ? profile!.deviceId! : '' }, '2025-03-09', '2025-03-09T20:00:00.000Z'), RETURN_CODE, sealing);
    const third = await importHomeReport(t.store, later, RETURN_CODE, t.patient);
    expect(third.replaced).toBe(1);
    const now = await t.store.adherenceEntries.byPatient(t.patient.id);
    expect(now.map((e) => [e.sessionsPlanned, e.sessionsDone])).toEqual([[10, 8]]);

    // The phone refuses a programme of another patient.
    const [otherProgramme] = (await t.store.homeProgrammes.byPatient(t.other.id)) as HomeProgramme[];
    const foreignText = await createProgrammePackage({ patient: t.other, programme: otherProgramme!, issuedAt: '2025-03-01T10:00:00.000Z' }, CODE, sealing);
    await expect(openProgrammePackage(foreignText, CODE, t.patient.id)).rejects.toMatchObject({ code: 'ForeignPatient' });
    const foreignPkg = await openProgrammePackage(foreignText, CODE, null);
    await expect(acceptProgrammePackage(phone, foreignPkg, { now: () => 0, platform: null, today: '2025-03-03' })).rejects.toMatchObject({ code: 'ForeignPatient' });
    expect((await phone.homeProgrammes.list()).map((p) => p.patientId)).toEqual([t.patient.id]);
    t.store.close();
    phone.close();
  });

  it('patient mode is refused on a device that already has a therapist', async () => {
    const t = await therapist();
    await expect(choosePatientMode(t.store)).rejects.toMatchObject({ code: 'ValidationFailed' });
    t.store.close();
  });
});
