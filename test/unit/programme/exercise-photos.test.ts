// Exercise photos: the shared rules (domain), their own table (store, schema v8), and the trip in
// the programme file to the patient's phone. Photo bytes here are hand-made headers with filler:
// nothing in this path decodes pixels (the page does, with canvas; see programme.e2e.ts).
import { describe, expect, it } from 'vitest';
import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import { EMPTY_DOSE, MAX_PHOTO_BYTES, exercisePhotoProblem, photoEncodingAttempts, sniffPhotoType, type ExercisePhoto, type HomeProgramme, type Patient } from '../../../src/lib/domain';
import { fitWithin } from '../../../src/lib/domain/exercise-photo';
import { followExerciseOrder, openStore, photosOfProgramme, putExercisePhoto, type KinnoteStore } from '../../../src/lib/store';
import { replaceProgrammePhotos } from '../../../src/lib/store/exercise-photos';
import { acceptProgrammePackage, choosePatientMode, createProgrammePackage, openProgrammePackage, planToProgrammeInput, type ExercisePlan } from '../../../src/lib/programme';
import { sealTransfer } from '../../../src/lib/programme/sealed-transfer';
import { freshStore, steppingClock, TEST_ITERATIONS } from '../store/store-helpers';

let seed = 7;
const randomBytes = (n: number) => Uint8Array.from({ length: n }, () => (seed = (seed * 48271) % 2147483647) & 255);
const sealing = { randomBytes, iterations: TEST_ITERATIONS };
const CODE = '7KQ2M-XD4PH';

const ascii = (s: string) => Array.from(s, (c) => c.charCodeAt(0));
/** A RIFF/WEBP header (RFC 9649 §2.5: "RIFF", little-endian size, "WEBP") followed by `size - 12` filler bytes. */
function webpBytes(size: number, fill = 1): Uint8Array {
  const out = new Uint8Array(size).fill(fill);
  out.set([...ascii('RIFF'), (size - 8) & 255, ((size - 8) >> 8) & 255, ((size - 8) >> 16) & 255, 0, ...ascii('WEBP'), ...ascii('VP8 ')]);
  return out;
}
/** SOI marker FF D8 then an APP0 marker FF E0 (ITU T.81 Annex B; JFIF). */
function jpegBytes(size: number): Uint8Array {
  const out = new Uint8Array(size).fill(3);
  out.set([0xff, 0xd8, 0xff, 0xe0]);
  return out;
}

describe('photo rules (domain)', () => {
  it('recognises WebP and JPEG by their first bytes, and nothing else', () => {
    expect(sniffPhotoType(webpBytes(40))).toBe('image/webp');
    expect(sniffPhotoType(jpegBytes(40))).toBe('image/jpeg');
    // PNG signature (RFC 2083 §3.1), a RIFF that is a WAVE file, GIF, text, too short.
    expect(sniffPhotoType(Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0]))).toBeNull();
    expect(sniffPhotoType(Uint8Array.from([...ascii('RIFF'), 4, 0, 0, 0, ...ascii('WAVE')]))).toBeNull();
    expect(sniffPhotoType(Uint8Array.from(ascii('GIF89a......')))).toBeNull();
    expect(sniffPhotoType(Uint8Array.from(ascii('hello')))).toBeNull();
    expect(sniffPhotoType(Uint8Array.from([0xff, 0xd8]))).toBeNull();
  });

  it('fits sides within a longest side, never enlarging (hand-worked)', () => {
    expect(fitWithin(4000, 3000, 1024)).toEqual({ widthPx: 1024, heightPx: 768 });
    expect(fitWithin(3000, 4000, 1024)).toEqual({ widthPx: 768, heightPx: 1024 });
    expect(fitWithin(640, 480, 1024)).toEqual({ widthPx: 640, heightPx: 480 });
    expect(fitWithin(10_000, 10, 1024)).toEqual({ widthPx: 1024, heightPx: 1 });
    expect(() => fitWithin(0, 10, 1024)).toThrow(RangeError);
  });

  it('steps quality down first, then size, from 1024 px to no less than 480 px (hand-worked ladder)', () => {
    const attempts = photoEncodingAttempts(4000, 3000);
    // Longest sides: 1024, floor(1024·0.8) = 819, floor(819·0.8) = 655, floor(655·0.8) = 524; 419 < 480 stops.
    const sizes = [...new Set(attempts.map((a) => `${a.widthPx}x${a.heightPx}`))];
    expect(sizes).toEqual(['1024x768', '819x614', '655x491', '524x393']);
    expect(attempts.slice(0, 4).map((a) => a.quality)).toEqual([0.82, 0.72, 0.62, 0.52]);
    expect(attempts).toHaveLength(16);
    // A small picture is never enlarged and is tried at its own size only.
    expect(new Set(photoEncodingAttempts(300, 200).map((a) => `${a.widthPx}x${a.heightPx}`))).toEqual(new Set(['300x200']));
  });

  it('names what is wrong with a photo', () => {
    const ok = { exercise: 0, position: 1, type: 'image/webp' as const, widthPx: 1024, heightPx: 768, bytes: webpBytes(2000) };
    expect(exercisePhotoProblem(ok, 2)).toBeNull();
    expect(exercisePhotoProblem({ ...ok, exercise: 2 }, 2)).toMatch(/exercise 3 does not exist/);
    expect(exercisePhotoProblem({ ...ok, position: 3 }, 2)).toMatch(/position must be 1 to 2/);
    expect(exercisePhotoProblem({ ...ok, bytes: webpBytes(MAX_PHOTO_BYTES + 1) }, 2)).toMatch(/150001 bytes; at most 150000/);
    expect(exercisePhotoProblem({ ...ok, bytes: webpBytes(MAX_PHOTO_BYTES) }, 2)).toBeNull();
    expect(exercisePhotoProblem({ ...ok, type: 'image/jpeg' }, 2)).toMatch(/says image\/jpeg but is image\/webp/);
    expect(exercisePhotoProblem({ ...ok, bytes: Uint8Array.from(ascii('<svg onload=alert(1)>')) }, 2)).toMatch(/neither WebP nor JPEG/);
    expect(exercisePhotoProblem({ ...ok, widthPx: 1025 }, 2)).toMatch(/1 to 1024 px/);
    expect(exercisePhotoProblem({ ...ok, bytes: new Uint8Array(0) }, 2)).toMatch(/empty/);
  });
});

const plan: ExercisePlan = {
  title: 'Stretches at home',
  startsOn: '2025-03-03',
  endsOn: null,
  exercises: [
    { name: 'Calf stretch against a wall', dose: { ...EMPTY_DOSE, holdSeconds: 30, repetitions: 3, timesPerDay: 1 }, dosageText: '' },
    { name: 'Sit to stand', dose: { ...EMPTY_DOSE, repetitions: 8, sets: 2, daysPerWeek: 5 }, dosageText: '' },
    { name: 'Resting splint', dose: { ...EMPTY_DOSE, overnight: true }, dosageText: '' },
  ],
};

async function therapist() {
  const store = await freshStore({ now: steppingClock(Date.UTC(2025, 2, 1, 9)) });
  const patient = (await store.patients.create({ code: 'K7QM-3XHD', birthYear: 1961, condition: 'stroke', affectedSides: ['left'], status: 'active' })) as Patient;
  const programme = (await store.homeProgrammes.create(planToProgrammeInput(plan, patient.id))) as HomeProgramme;
  return { store, patient, programme };
}
const photo = (programme: HomeProgramme, exercise: number, position: number, bytes: Uint8Array, type: 'image/webp' | 'image/jpeg' = 'image/webp'): ExercisePhoto => ({
  programmeId: programme.id,
  patientId: programme.patientId,
  exercise,
  position,
  type,
  widthPx: 1024,
  heightPx: 768,
  bytes,
});

async function patientPhone(): Promise<KinnoteStore> {
  const store = await openStore({ name: 'kinnote-phone', now: steppingClock(Date.UTC(2025, 2, 3, 8)), kdfIterations: TEST_ITERATIONS, idleTimeoutMs: null, indexedDB: new IDBFactory(), IDBKeyRange });
  await choosePatientMode(store);
  return store;
}

describe('the exercise photos table', () => {
  it('keeps photos apart from the programme record and its audit, in their places', async () => {
    const t = await therapist();
    const auditBefore = await t.store.audit.count();
    await putExercisePhoto(t.store, photo(t.programme, 0, 1, webpBytes(140_000)), 3);
    await putExercisePhoto(t.store, photo(t.programme, 0, 2, jpegBytes(900), 'image/jpeg'), 3);
    await putExercisePhoto(t.store, photo(t.programme, 2, 1, webpBytes(500, 9)), 3);
    // Replacing a place keeps one photo there.
    await putExercisePhoto(t.store, photo(t.programme, 2, 1, webpBytes(600, 8)), 3);
    const rows = await photosOfProgramme(t.store, t.programme.id);
    expect(rows.map((r) => [r.exercise, r.position, r.bytes.length])).toEqual([
      [0, 1, 140_000],
      [0, 2, 900],
      [2, 1, 600],
    ]);
    expect(await t.store.audit.count()).toBe(auditBefore);
    expect(JSON.stringify(await t.store.homeProgrammes.get(t.programme.id))).not.toMatch(/RIFF|bytes/);
    // A bad photo is refused with its place named; nothing is written.
    await expect(putExercisePhoto(t.store, photo(t.programme, 1, 1, webpBytes(MAX_PHOTO_BYTES + 10)), 3)).rejects.toThrow(/photo 1 of exercise 2: .*at most 150000/);
    await expect(replaceProgrammePhotos(t.store, t.programme.id, [photo(t.programme, 1, 1, webpBytes(100)), photo(t.programme, 1, 2, Uint8Array.from(ascii('not an image')))], 3)).rejects.toThrow(/photo 2 of exercise 2/);
    expect((await photosOfProgramme(t.store, t.programme.id)).length).toBe(3);
    t.store.close();
  });

  it('photos follow their exercise when the programme is re-ordered; those of removed exercises go', async () => {
    const t = await therapist();
    await putExercisePhoto(t.store, photo(t.programme, 0, 1, webpBytes(100, 1)), 3);
    await putExercisePhoto(t.store, photo(t.programme, 1, 1, webpBytes(100, 2)), 3);
    await putExercisePhoto(t.store, photo(t.programme, 2, 2, webpBytes(100, 3)), 3);
    // New order: old 2, a new exercise, old 0 (old 1 removed).
    await followExerciseOrder(t.store, t.programme.id, [2, null, 0]);
    const rows = await photosOfProgramme(t.store, t.programme.id);
    expect(rows.map((r) => [r.exercise, r.position, r.bytes[20]])).toEqual([
      [0, 2, 3],
      [2, 1, 1],
    ]);
    t.store.close();
  });
});

describe('photos in the programme file', () => {
  it('travel to the phone byte for byte; a QR (text-only) re-send keeps them only beside unchanged exercises', async () => {
    const t = await therapist();
    const big = webpBytes(MAX_PHOTO_BYTES);
    const photos = [photo(t.programme, 0, 1, big), photo(t.programme, 0, 2, jpegBytes(3000), 'image/jpeg'), photo(t.programme, 1, 1, webpBytes(5000, 4))];
    for (const p of photos) await putExercisePhoto(t.store, p, 3);
    const stored = await photosOfProgramme(t.store, t.programme.id);
    const withPhotos = await createProgrammePackage({ patient: t.patient, programme: t.programme, issuedAt: '2025-03-01T10:00:00.000Z', photos: stored }, CODE, sealing);
    const textOnly = await createProgrammePackage({ patient: t.patient, programme: t.programme, issuedAt: '2025-03-01T10:00:00.000Z' }, CODE, sealing);
    // Base64 makes 4 characters of 3 bytes: the file grows by at least the photos' bytes.
    expect(withPhotos.length - textOnly.length).toBeGreaterThan(MAX_PHOTO_BYTES + 3000 + 5000);

    const opened = await openProgrammePackage(withPhotos, CODE, null);
    expect(opened.photos.map((p) => [p.exercise, p.position, p.type, p.bytes.length])).toEqual([
      [0, 1, 'image/webp', MAX_PHOTO_BYTES],
      [0, 2, 'image/jpeg', 3000],
      [1, 1, 'image/webp', 5000],
    ]);
    const phone = await patientPhone();
    await acceptProgrammePackage(phone, opened, { now: () => Date.UTC(2025, 2, 3, 8), platform: 'test', today: '2025-03-03' });
    const onPhone = await photosOfProgramme(phone, t.programme.id);
    expect(onPhone.map((p) => p.bytes)).toEqual(photos.map((p) => p.bytes));
    expect(onPhone.every((p) => p.patientId === t.patient.id)).toBe(true);

    // The therapist renames exercise 2 and re-sends as QR codes (no photos): exercise 1 keeps its
    // two photos, exercise 2's photo goes (it showed the old exercise).
    const renamed = (await t.store.homeProgrammes.update(t.programme.id, { items: t.programme.items.map((item, i) => (i === 1 ? { ...item, name: 'Step-ups on the bottom stair' } : item)) }, { expectedUpdatedAt: t.programme.updatedAt })) as HomeProgramme;
    Object.assign(phone.context, { now: steppingClock(Date.UTC(2025, 2, 4, 8)) });
    const qr = await openProgrammePackage(await createProgrammePackage({ patient: t.patient, programme: renamed, issuedAt: '2025-03-03T10:00:00.000Z' }, CODE, sealing), CODE, t.patient.id);
    expect(qr.photos).toEqual([]);
    await acceptProgrammePackage(phone, qr, { now: () => Date.UTC(2025, 2, 4, 8), platform: 'test', today: '2025-03-04' });
    expect((await photosOfProgramme(phone, t.programme.id)).map((p) => [p.exercise, p.position])).toEqual([
      [0, 1],
      [0, 2],
    ]);
    t.store.close();
    phone.close();
  });

  it('refuses a file whose photo is damaged, too large, mislabelled or misplaced, naming the photo', async () => {
    const t = await therapist();
    const base = { format: 'kinnote-home-programme', formatVersion: 3, issuedAt: '2025-03-01T10:00:00.000Z', patient: { id: t.patient.id, code: t.patient.code }, programme: t.programme };
    const good = { exercise: 0, position: 1, type: 'image/webp', widthPx: 100, heightPx: 80, data: Buffer.from(webpBytes(300)).toString('base64') };
    const seal = (photos: unknown[]) => sealTransfer(JSON.stringify({ ...base, photos }), CODE, sealing);
    await expect(openProgrammePackage(await seal([good]), CODE)).resolves.toMatchObject({ photos: [{ exercise: 0 }] });
    const cases: [unknown[], RegExp][] = [
      [[good, { ...good, data: 'not base64!' }], /Photo 2 .*damaged/],
      [[{ ...good, data: Buffer.from(webpBytes(MAX_PHOTO_BYTES + 3)).toString('base64') }], /at most 150000|larger than a photo/],
      [[{ ...good, type: 'image/jpeg' }], /Photo 1 .*says image\/jpeg but is image\/webp/],
      [[{ ...good, data: Buffer.from('<svg/>').toString('base64') }], /Photo 1 .*neither WebP nor JPEG/],
      [[{ ...good, exercise: 3 }], /Photo 1 .*exercise 4 does not exist/],
      [[good, { ...good }], /two photos in one place/],
      [[{ ...good, type: 'image/png' }], /photos\.0\.type/],
    ];
    for (const [photos, message] of cases) {
      await expect(openProgrammePackage(await seal(photos), CODE)).rejects.toMatchObject({ code: 'Invalid', message: expect.stringMatching(message) });
    }
    t.store.close();
  });
});
