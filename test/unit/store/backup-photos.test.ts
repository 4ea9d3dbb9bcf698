// Exercise photos in backups: exported beside the tables (inside the checksum), checked before
// anything is written, restored with the records in one transaction; backups made before photos
// were backed up still restore; and the patient's phone saves a received programme and its photos
// all or nothing. Photo bytes are hand-made headers with filler (RFC 9649 §2.5 RIFF/WEBP; ITU T.81
// SOI for JPEG): nothing here decodes pixels.
import { describe, expect, it } from 'vitest';
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import { EMPTY_DOSE, MAX_PHOTO_BYTES, type ExercisePhoto, type HomeProgramme, type Patient } from '../../../src/lib/domain';
import { canonicalJson, importBackup, openStore, photosOfProgramme, putExercisePhoto, StoreError, type KinnoteStore } from '../../../src/lib/store';
import { exportBackup } from '../../../src/lib/store/export-backup';
import { sha256Hex } from '../../../src/lib/store/crypto-box';
import { type BackupBundle } from '../../../src/lib/store/backup-bundle';
import { acceptProgrammePackage, choosePatientMode, createProgrammePackage, openProgrammePackage, planToProgrammeInput, type ExercisePlan } from '../../../src/lib/programme';
import { dumpAll, freshStore, quotaFault, steppingClock, TEST_ITERATIONS } from './store-helpers';

const ascii = (s: string) => Array.from(s, (c) => c.charCodeAt(0));
function webpBytes(size: number, fill = 1): Uint8Array {
  const out = new Uint8Array(size).fill(fill);
  out.set([...ascii('RIFF'), (size - 8) & 255, ((size - 8) >> 8) & 255, ((size - 8) >> 16) & 255, 0, ...ascii('WEBP'), ...ascii('VP8 ')]);
  return out;
}
const plan: ExercisePlan = {
  title: 'Stretches at home',
  startsOn: '2025-03-03',
  endsOn: null,
  exercises: [
    { name: 'Calf stretch against a wall', dose: { ...EMPTY_DOSE, holdSeconds: 30, repetitions: 3, timesPerDay: 1 }, dosageText: '' },
    { name: 'Sit to stand', dose: { ...EMPTY_DOSE, repetitions: 8, sets: 2, daysPerWeek: 5 }, dosageText: '' },
  ],
};
const photo = (programme: HomeProgramme, exercise: number, position: number, bytes: Uint8Array): ExercisePhoto => ({ programmeId: programme.id, patientId: programme.patientId, exercise, position, type: 'image/webp', widthPx: 800, heightPx: 600, bytes });

async function clinic(store?: KinnoteStore) {
  const s = store ?? (await freshStore());
  const patient = (await s.patients.create({ code: 'K7QM-3XHD', birthYear: 1961, condition: 'stroke', affectedSides: ['left'], status: 'active' })) as Patient;
  const other = (await s.patients.create({ code: 'B4TR-9WXE', birthYear: 1975, condition: 'stroke', affectedSides: [], status: 'active' })) as Patient;
  const programme = (await s.homeProgrammes.create(planToProgrammeInput(plan, patient.id))) as HomeProgramme;
  const otherProgramme = (await s.homeProgrammes.create(planToProgrammeInput(plan, other.id))) as HomeProgramme;
  await putExercisePhoto(s, photo(programme, 0, 1, webpBytes(MAX_PHOTO_BYTES, 5)), 2);
  await putExercisePhoto(s, photo(programme, 1, 2, webpBytes(700, 6)), 2);
  await putExercisePhoto(s, photo(otherProgramme, 0, 1, webpBytes(900, 7)), 2);
  return { store: s, patient, other, programme, otherProgramme };
}
const bytesOf = async (store: KinnoteStore, programmeId: string) => (await photosOfProgramme(store, programmeId)).map((p) => [p.exercise, p.position, p.bytes.length, p.bytes[20]]);
async function resign(bundle: BackupBundle): Promise<BackupBundle> {
  const { checksum: _c, ...body } = bundle;
  return { ...body, checksum: { algorithm: 'SHA-256', value: await sha256Hex(canonicalJson(body)) } };
}

describe('photos in backups', () => {
  it('a whole-store backup restores every photo byte for byte; a one-patient backup carries only that patient\'s', async () => {
    const c = await clinic();
    const bundle = await exportBackup(c.store, { protectedContent: 'omit' });
    expect(bundle.photos).toHaveLength(3);
    const restored = await freshStore();
    const report = await importBackup(restored, JSON.parse(JSON.stringify(bundle)));
    expect(report.photos).toEqual({ written: 3, removed: 0 });
    expect(await bytesOf(restored, c.programme.id)).toEqual([
      [0, 1, MAX_PHOTO_BYTES, 5],
      [1, 2, 700, 6],
    ]);
    expect(await bytesOf(restored, c.otherProgramme.id)).toEqual([[0, 1, 900, 7]]);
    // The same backup again changes nothing.
    expect((await importBackup(restored, bundle)).changed).toBe(false);

    const one = await exportBackup(c.store, { protectedContent: 'omit', scope: { kind: 'patient', patientId: c.patient.id } });
    expect(one.photos?.map((p) => p.programmeId)).toEqual([c.programme.id, c.programme.id]);
  });

  it('a backup made before photos were backed up (no "photos") still restores, and leaves the photos there alone', async () => {
    const c = await clinic();
    const { photos: _none, ...old } = await exportBackup(c.store, { protectedContent: 'omit' });
    const oldBundle = await resign(old as BackupBundle);
    expect('photos' in oldBundle).toBe(false);
    const restored = await freshStore();
    const report = await importBackup(restored, oldBundle);
    expect(report.counts.homeProgrammes.inserted).toBe(2);
    expect(await photosOfProgramme(restored, c.programme.id)).toEqual([]);
    // Into the store that has them: nothing removed.
    await importBackup(c.store, oldBundle);
    expect(await bytesOf(c.store, c.programme.id)).toHaveLength(2);
  });

  it('refuses a backup with a bad photo, naming it, and writes nothing (no record, no photo)', async () => {
    const c = await clinic();
    const good = await exportBackup(c.store, { protectedContent: 'omit' });
    const first = good.photos![1]!;
    const cases: [unknown, RegExp][] = [
      [{ ...first, type: 'image/jpeg' }, /photos\[1\].*says image\/jpeg but is image\/webp/],
      [{ ...first, data: Buffer.from(webpBytes(MAX_PHOTO_BYTES + 3)).toString('base64') }, /photos\[1\].*larger than a photo may be/],
      [{ ...first, data: Buffer.from('<svg onload=alert(1)>').toString('base64') }, /photos\[1\].*neither WebP nor JPEG/],
      [{ ...first, exercise: 2 }, /photos\[1\].*exercise 3 does not exist/],
      [{ ...first, programmeId: '0190a0b0-0000-7000-8000-000000000999' }, /photos\[1\].*programmeId.*does not carry/],
      [{ ...first, patientId: c.other.id }, /photos\[1\].*patientId.*not the patient/],
      [{ ...first, data: 'not base64!' }, /photos\[1\].*not base64/],
      [{ ...first, extra: 1 }, /photos\[1\]/],
      [good.photos![0], /photos\[1\].*share one place/],
    ];
    for (const [bad, message] of cases) {
      const edited = await resign({ ...good, photos: [good.photos![0]!, bad as never, ...good.photos!.slice(2)] });
      const empty = await freshStore();
      const before = await dumpAll(empty);
      const error = await importBackup(empty, edited).catch((e: unknown) => e);
      expect(error, JSON.stringify(bad).slice(0, 80)).toBeInstanceOf(StoreError);
      expect((error as StoreError).code).toBe('InvalidBundle');
      expect((error as Error).message).toMatch(message);
      expect(await dumpAll(empty)).toEqual(before);
    }
    // The photos count under the checksum: an edit without re-signing is caught as tampering.
    await expect(importBackup(await freshStore(), { ...good, photos: good.photos!.slice(1) })).rejects.toMatchObject({ code: 'TamperedBundle' });
  });

  it('merges: an unchanged programme gains photos only in empty places; a newer incoming programme brings exactly its photos; a newer local one keeps its own', async () => {
    const c = await clinic();
    const bundle = await exportBackup(c.store, { protectedContent: 'omit' });
    const target = await freshStore();
    await importBackup(target, await resign({ ...bundle, photos: [] }));
    // The target has its own photo where the bundle has one (0,1), and none at (1,2).
    await putExercisePhoto(target, photo(c.programme, 0, 1, webpBytes(300, 9)), 2);
    await importBackup(target, bundle);
    expect(await bytesOf(target, c.programme.id)).toEqual([
      [0, 1, 300, 9],
      [1, 2, 700, 6],
    ]);
    // The clinic edits the programme (newer) and drops a photo: that version's photos replace the target's.
    const edited = (await c.store.homeProgrammes.update(c.programme.id, { title: 'Stretches, week 2' }, { expectedUpdatedAt: c.programme.updatedAt })) as HomeProgramme;
    await c.store.db.table('exercisePhotos').delete(`${c.programme.id}:1:2`);
    const report = await importBackup(target, await exportBackup(c.store, { protectedContent: 'omit' }));
    expect(report.counts.homeProgrammes.replaced).toBe(1);
    expect(report.photos).toEqual({ written: 1, removed: 1 });
    expect(await bytesOf(target, edited.id)).toEqual([[0, 1, MAX_PHOTO_BYTES, 5]]);
    // The target edits its copy (newer than the clinic's): restoring the clinic's older backup keeps the target's photos.
    const current = (await target.homeProgrammes.get(edited.id)) as HomeProgramme;
    await target.homeProgrammes.update(edited.id, { title: 'Stretches, week 3' }, { expectedUpdatedAt: current.updatedAt });
    await putExercisePhoto(target, photo(c.programme, 1, 1, webpBytes(400, 3)), 2);
    await importBackup(target, await exportBackup(c.store, { protectedContent: 'omit' }));
    expect(await bytesOf(target, edited.id)).toEqual([
      [0, 1, MAX_PHOTO_BYTES, 5],
      [1, 1, 400, 3],
    ]);
  });
});

describe('the phone saves a received programme with its photos, all or nothing', () => {
  it('a full disk during the save leaves neither the programme nor any photo; the retry saves both', async () => {
    const c = await clinic();
    const code = '7KQ2M-XD4PH';
    let seed = 3;
    const randomBytes = (n: number) => Uint8Array.from({ length: n }, () => (seed = (seed * 48271) % 2147483647) & 255);
    const text = await createProgrammePackage({ patient: c.patient, programme: c.programme, issuedAt: '2025-03-01T10:00:00.000Z', photos: await photosOfProgramme(c.store, c.programme.id) }, code, { randomBytes, iterations: TEST_ITERATIONS });
    // The 5th write fails: with the photos saved after the programme (the earlier code), that was the
    // photo write, and the programme stayed without its photos (checked: this test then fails).
    const fault = quotaFault(4);
    const phone = await openStore({ name: 'kinnote-phone', now: steppingClock(Date.UTC(2025, 2, 3, 8)), kdfIterations: TEST_ITERATIONS, idleTimeoutMs: null, indexedDB: new IDBFactory(), IDBKeyRange, middleware: [fault] });
    await choosePatientMode(phone);
    const pkg = await openProgrammePackage(text, code);
    const options = { now: () => Date.UTC(2025, 2, 3, 8), platform: 'test', today: '2025-03-03' };
    fault.armed = true;
    const error = await acceptProgrammePackage(phone, pkg, options).catch((e: unknown) => e);
    fault.armed = false;
    expect((error as StoreError).code).toBe('QuotaExceeded');
    expect(await phone.db.table('homeProgrammes').count()).toBe(0);
    expect(await photosOfProgramme(phone, c.programme.id)).toEqual([]);
    await acceptProgrammePackage(phone, pkg, options);
    expect((await phone.homeProgrammes.list()).map((p) => p.id)).toEqual([c.programme.id]);
    expect(await bytesOf(phone, c.programme.id)).toEqual([
      [0, 1, MAX_PHOTO_BYTES, 5],
      [1, 2, 700, 6],
    ]);
  });
});
