// Dose problems travel as codes (domain/exercise-dose.ts), so each screen words them in its own
// language: the therapist's editor in English, a patient's phone in the patient's language. The
// codes are checked against hand-written expectations; then a programme file with a broken dose is
// opened and refused, and a Spanish patient's screen must show it with no English word in it.
import * as v from 'valibot';
import { describe, expect, it } from 'vitest';
import { EMPTY_DOSE, ExerciseDoseSchema, doseIssueOf, type DoseField, type DoseProblem, type ExerciseDose } from '../../../src/lib/domain';
import { ProgrammeTransferError, checkExercisePlan, openProgrammePackage, type ExercisePlan } from '../../../src/lib/programme';
import { sealTransfer } from '../../../src/lib/programme/sealed-transfer';
import { ENGLISH_MESSAGES } from '../../../src/lib/ui/programme/patient-messages';
import { SPANISH_MESSAGES } from '../../../src/lib/ui/programme/patient-messages-es';
import { refusedProgrammeText } from '../../../src/lib/ui/programme/refused-programme';
import { THERAPIST_MESSAGES } from '../../../src/lib/ui/programme/therapist-messages';
import { TEST_ITERATIONS } from '../store/store-helpers';

const plan = (dose: Partial<ExerciseDose>): ExercisePlan => ({
  title: 'Stretches at home',
  startsOn: '2025-03-03',
  endsOn: null,
  exercises: [
    { name: 'Calf stretch', dose: { ...EMPTY_DOSE, repetitions: 3, timesPerDay: 1 }, dosageText: '' },
    { name: 'Sit to stand', dose: { ...EMPTY_DOSE, ...dose }, dosageText: '' },
  ],
});

/** Each broken dose (of exercise 2) and the problem it must be reported as; written by hand from the schema's limits. */
const CASES: Array<[string, Partial<ExerciseDose>, DoseField | null, DoseProblem]> = [
  ['a number typed as a word (NaN)', { repetitions: Number.NaN }, 'repetitions', { code: 'wholeNumber' }],
  ['a fraction', { sets: 2.5 }, 'sets', { code: 'wholeNumber' }],
  ['zero', { holdSeconds: 0 }, 'holdSeconds', { code: 'atLeast', min: 1 }],
  ['too many sets', { sets: 21 }, 'sets', { code: 'atMost', max: 20 }],
  ['more than 12 hours', { durationMinutes: 721 }, 'durationMinutes', { code: 'atMost', max: 720 }],
  ['eight days a week', { daysPerWeek: 8 }, 'daysPerWeek', { code: 'atMost', max: 7 }],
  ['a note of 201 characters', { repetitions: 3, note: 'x'.repeat(201) }, 'note', { code: 'noteTooLong', max: 200 }],
  ['overnight twice a day', { overnight: true, timesPerDay: 2 }, 'timesPerDay', { code: 'overnightOnceADay' }],
  ['nothing prescribed', {}, null, { code: 'nothingPrescribed' }],
];

describe('dose problems as codes', () => {
  it.each(CASES)('reports %s as its code, field and exercise', (_, dose, field, problem) => {
    const checked = checkExercisePlan(plan(dose));
    expect(checked.ok).toBe(false);
    if (checked.ok) return;
    expect(checked.issues[0]!.dose).toEqual({ exercise: 2, field, problem });
  });

  it('reads a bare dose too, and leaves issues that are not a dose\'s without a code', () => {
    const bare = v.safeParse(ExerciseDoseSchema, { ...EMPTY_DOSE, sets: 0 });
    expect(bare.success).toBe(false);
    expect(doseIssueOf(bare.issues![0]!)).toEqual({ field: 'sets', problem: { code: 'atLeast', min: 1 } });
    const noName = checkExercisePlan({ ...plan({ repetitions: 3 }), title: '' });
    expect(noName.ok).toBe(false);
    if (!noName.ok) expect(noName.issues.map((i) => i.dose)).toEqual([null]);
  });

  it('words each problem for the therapist as the check always did', () => {
    // The editor's English, written out by hand (e2e tests and therapists know these words).
    expect(THERAPIST_MESSAGES.doseProblem({ code: 'wholeNumber' })).toBe('must be a whole number');
    expect(THERAPIST_MESSAGES.doseProblem({ code: 'atMost', max: 20 })).toBe('must be at most 20');
    expect(THERAPIST_MESSAGES.doseProblem({ code: 'overnightOnceADay' })).toBe('overnight is once a day: leave times a day empty or 1');
  });
});

describe('a programme file refused for its dose, on a Spanish patient\'s phone', () => {
  const CODE = '7KQ2M-XD4PH';
  let seed = 7;
  const sealing = { randomBytes: (n: number) => Uint8Array.from({ length: n }, () => (seed = (seed * 48271) % 2147483647) & 255), iterations: TEST_ITERATIONS };
  const patient = { id: '0190f0e0-0000-7000-8000-000000000001', code: 'K7QM-3XHD' };
  const stamp = { createdAt: '2025-03-01T09:00:00.000Z', updatedAt: '2025-03-01T09:00:00.000Z', deviceId: '0190f0e0-0000-7000-8000-0000000000d1', clinicianId: '0190f0e0-0000-7000-8000-0000000000c1', deleted: false };

  /** A file as another app version (or a tampered editor) could write it: sealed without the maker's checks. */
  async function fileWithDose(dose: Partial<ExerciseDose>): Promise<string> {
    const programme = {
      id: '0190f0e0-0000-7000-8000-0000000000a1',
      ...stamp,
      patientId: patient.id,
      title: 'Stretches at home',
      items: [
        { name: 'Calf stretch', dosage: '', dose: { ...EMPTY_DOSE, repetitions: 3, timesPerDay: 1 } },
        { name: 'Sit to stand', dosage: '', dose: { ...EMPTY_DOSE, ...dose } },
      ],
      sessionsPerWeek: 14,
      startsOn: '2025-03-03',
      endsOn: null,
    };
    const body = { format: 'kinnote-home-programme', formatVersion: 4, issuedAt: '2025-03-01T10:00:00.000Z', patient, programme, language: 'es' };
    return sealTransfer(JSON.stringify(body), CODE, sealing);
  }

  async function refusal(dose: Partial<ExerciseDose>): Promise<ProgrammeTransferError> {
    const opened = await openProgrammePackage(await fileWithDose(dose), CODE).then(
      () => null,
      (e: unknown) => e,
    );
    expect(opened).toBeInstanceOf(ProgrammeTransferError);
    return opened as ProgrammeTransferError;
  }

  /** Every English word (3 letters or more) the English patient and therapist catalogues use for dose problems and fields. */
  const englishWords = new Set(
    [
      ...CASES.map(([, , , p]) => ENGLISH_MESSAGES.doseProblem(p)),
      ...CASES.map(([, , , p]) => THERAPIST_MESSAGES.doseProblem(p)),
      ...(['repetitions', 'sets', 'holdSeconds', 'durationMinutes', 'overnight', 'timesPerDay', 'daysPerWeek', 'note'] as const).map(ENGLISH_MESSAGES.doseField),
      ENGLISH_MESSAGES.receiveDoseRefused(2, 'sets', ''),
    ]
      .join(' ')
      .toLowerCase()
      .match(/\p{L}{3,}/gu),
  );

  it('names the exercise, the field and the problem in Spanish (hand-written sentence)', async () => {
    const error = await refusal({ repetitions: 0 });
    expect(error.code, error.message).toBe('Invalid');
    expect(error.dose).toEqual({ exercise: 2, field: 'repetitions', problem: { code: 'atLeast', min: 1 } });
    expect(refusedProgrammeText(error, SPANISH_MESSAGES)).toBe(
      'No se puede usar este programa: ejercicio 2, repeticiones: debe ser como mínimo 1. No se ha guardado nada. Pide a tu terapeuta un programa corregido.',
    );
    // Before the codes, the phone showed the check's English whatever its language.
    expect(error.message).toMatch(/must be at least 1/);
  });

  // JSON cannot carry NaN (it reads back as null: nothing prescribed), so a file has every case but the first.
  it.each(CASES.slice(1))('shows %s with no English word', async (_, dose, field, problem) => {
    const error = await refusal(dose);
    expect(error.dose).toEqual({ exercise: 2, field, problem });
    const spanish = refusedProgrammeText(error, SPANISH_MESSAGES).toLowerCase();
    const english = (spanish.match(/\p{L}{3,}/gu) ?? []).filter((w) => englishWords.has(w));
    expect(english, spanish).toEqual([]);
  });
});

describe('a programme file refused for any other reason, on a Spanish patient\'s phone', () => {
  const CODE = '7KQ2M-XD4PH';
  let seed = 11;
  const sealing = { randomBytes: (n: number) => Uint8Array.from({ length: n }, () => (seed = (seed * 48271) % 2147483647) & 255), iterations: TEST_ITERATIONS };
  const body = (formatVersion: number) => JSON.stringify({ format: 'kinnote-home-programme', formatVersion, issuedAt: '2025-03-01T10:00:00.000Z', patient: { id: '0190f0e0-0000-7000-8000-000000000001', code: 'K7QM-3XHD' }, programme: {}, language: 'es' });

  async function refusal(file: string, code: string): Promise<ProgrammeTransferError> {
    const opened = await openProgrammePackage(file, code).then(
      () => null,
      (e: unknown) => e,
    );
    expect(opened).toBeInstanceOf(ProgrammeTransferError);
    return opened as ProgrammeTransferError;
  }

  /** Every English word (3 letters or more) of the errors' own messages: the phone must show none of them. */
  function englishLeft(spanish: string, error: ProgrammeTransferError): string[] {
    const english = new Set(error.message.toLowerCase().match(/\p{L}{3,}/gu) ?? []);
    // Words the two languages share, and the app's name.
    for (const same of ['kinnote', 'xd4ph']) english.delete(same);
    return (spanish.toLowerCase().match(/\p{L}{3,}/gu) ?? []).filter((w) => english.has(w));
  }

  it('words a wrong or mistyped code, an altered file, a file of another kind and a newer version in Spanish, never the English message', async () => {
    const sealed = await sealTransfer(body(4), CODE, sealing);
    const altered = sealed.slice(0, -12) + (sealed.at(-12) === 'A' ? 'B' : 'A') + sealed.slice(-11);
    const refusals = [
      await refusal(sealed, '22222-22222'),
      await refusal(sealed, 'not a code'),
      await refusal(altered, CODE),
      await refusal('{"hello": "world"}', CODE),
      await refusal(await sealTransfer(body(99), CODE, sealing), CODE),
    ];
    // The codes as the hand-off gives them (sealed-transfer.ts), in the order made above: an altered
    // sealed text fails its authentication exactly as a wrong code does (AES-GCM cannot tell them apart).
    expect(refusals.map((e) => e.code)).toEqual(['WrongCode', 'WrongCode', 'WrongCode', 'NotThisKind', 'Unsupported']);
    for (const error of refusals) {
      const spanish = refusedProgrammeText(error, SPANISH_MESSAGES);
      expect(spanish, error.code).not.toBe(error.message);
      expect(englishLeft(spanish, error), `${error.code}: ${spanish}`).toEqual([]);
      expect(refusedProgrammeText(error, ENGLISH_MESSAGES), error.code).toBe(ENGLISH_MESSAGES.receiveRefused(error.code));
    }
    // Hand-written: a wrong code, as a Spanish patient reads it.
    expect(refusedProgrammeText(refusals[0]!, SPANISH_MESSAGES)).toBe(
      'Este código no abre el archivo del programa (o el archivo se ha modificado). Un código tiene 10 letras y números, como 7KQ2M-XD4PH: revísalo y escríbelo de nuevo. No se ha guardado nada.',
    );
  });

  it('has a Spanish sentence for every refusal code, none of them the English one', () => {
    const codes = ['WrongCode', 'Tampered', 'NotThisKind', 'Unsupported', 'Invalid', 'ForeignPatient', 'Incomplete'] as const;
    const spanish = codes.map((c) => SPANISH_MESSAGES.receiveRefused(c));
    expect(new Set(spanish).size).toBe(codes.length);
    for (const [i, c] of codes.entries()) expect(spanish[i], c).not.toBe(ENGLISH_MESSAGES.receiveRefused(c));
  });
});
