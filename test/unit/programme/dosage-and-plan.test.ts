import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkExercisePlan, doseParts, doseSchedule, freeTextExercises, planToProgrammeInput, programmeToPlan, sessionsInFullWeek, type Exercise } from '../../../src/lib/programme';
import { EMPTY_DOSE, ExerciseDoseSchema, HomeProgrammeSchema, doseFromLegacyLine, type ExerciseDose } from '../../../src/lib/domain';
import * as v from 'valibot';
import { ENGLISH_MESSAGES } from '../../../src/lib/ui/programme/patient-messages';

const dose = (d: Partial<ExerciseDose>): ExerciseDose => ({ ...EMPTY_DOSE, ...d });
const calf: Exercise = { name: 'Calf stretch against a wall, back heel down', dose: dose({ holdSeconds: 30, repetitions: 3, sets: 2, timesPerDay: 2, note: 'each side' }), dosageText: '' };
const splint: Exercise = { name: 'Resting splint', dose: dose({ overnight: true, note: 'as tolerated' }), dosageText: '' };
const freeText: Exercise = { name: 'Stand at the frame', dose: null, dosageText: '3 × 30 s each side' };

describe('dose words (English, from the message catalogue)', () => {
  // Expected lines written by hand from the fields above; the note follows the parts, as DoseLine shows it.
  const formatDoseEnglish = (d: ExerciseDose) => [...doseParts(d).map(ENGLISH_MESSAGES.dosePart), ...(d.note === '' ? [] : [d.note])].join(' · ');
  const fixtures = [
    { input: calf.dose!, expected: 'hold 30 s · 3 repetitions · 2 sets · 2 times a day · every day · each side' },
    { input: splint.dose!, expected: 'overnight · as tolerated' },
    { input: dose({ durationMinutes: 120, timesPerDay: 1 }), expected: '2 h each time · 1 time a day · every day' },
    { input: dose({ repetitions: 8, sets: 2, daysPerWeek: 5 }), expected: '8 repetitions · 2 sets · on 5 days a week' },
    { input: dose({ durationMinutes: 90, overnight: false, daysPerWeek: 3, timesPerDay: 2 }), expected: '1 h 30 min each time · 2 times a day · on 3 days a week' },
    { input: dose({ repetitions: 1 }), expected: '1 repetition' },
  ];
  it.each(fixtures)('$expected', ({ input, expected }) => {
    expect(v.is(ExerciseDoseSchema, input)).toBe(true);
    expect(formatDoseEnglish(input)).toBe(expected);
  });
});

describe('dose schedule: only what was prescribed', () => {
  it('reads how often without inventing it', () => {
    expect(doseSchedule(null)).toBeNull();
    expect(doseSchedule(dose({ repetitions: 8, sets: 2 }))).toBeNull(); // "2 sets of 8": how often not said
    expect(doseSchedule(dose({ note: 'as tolerated' }))).toBeNull();
    expect(doseSchedule(dose({ timesPerDay: 2 }))).toEqual({ timesPerDay: 2, daysPerWeek: 7 });
    expect(doseSchedule(dose({ daysPerWeek: 3 }))).toEqual({ timesPerDay: 1, daysPerWeek: 3 });
    expect(doseSchedule(dose({ overnight: true }))).toEqual({ timesPerDay: 1, daysPerWeek: 7 });
  });

  it('refuses an empty dose and overnight more than once a day', () => {
    expect(v.is(ExerciseDoseSchema, EMPTY_DOSE)).toBe(false);
    expect(v.is(ExerciseDoseSchema, dose({ overnight: true, timesPerDay: 2 }))).toBe(false);
    expect(v.is(ExerciseDoseSchema, dose({ timesPerDay: 7 }))).toBe(false);
    expect(v.is(ExerciseDoseSchema, dose({ daysPerWeek: 8 }))).toBe(false);
  });
});

describe('lines written before doses were structured (schema v6 upgrade)', () => {
  it('reads back any line the old form wrote (round trip against an independent writer)', () => {
    // The old writer, copied here as a fixture of the pre-v6 format so the parser is checked against it.
    const oldLine = (d: { holdSeconds: number | null; repetitions: number | null; sets: number | null; times: number; per: 'day' | 'week'; caution: string }) => {
      const n = (k: number, one: string, many: string) => `${k} ${k === 1 ? one : many}`;
      const parts: string[] = [];
      if (d.holdSeconds !== null) parts.push(`hold ${d.holdSeconds} s`);
      if (d.repetitions !== null) parts.push(n(d.repetitions, 'repetition', 'repetitions'));
      if (d.sets !== null) parts.push(n(d.sets, 'set', 'sets'));
      parts.push(`${n(d.times, 'time', 'times')} a ${d.per}`);
      if (d.caution !== '') parts.push(`caution: ${d.caution}`);
      return parts.join(' · ');
    };
    const old = fc.record({
      holdSeconds: fc.option(fc.integer({ min: 1, max: 600 }), { nil: null }),
      repetitions: fc.option(fc.integer({ min: 1, max: 100 }), { nil: null }),
      sets: fc.option(fc.integer({ min: 1, max: 20 }), { nil: null }),
      times: fc.integer({ min: 1, max: 6 }),
      per: fc.constantFrom('day' as const, 'week' as const),
      caution: fc.stringMatching(/^[a-z ,.'()0-9-]{0,60}$/).map((s) => s.trim()),
    });
    fc.assert(
      fc.property(old, (d) => {
        const read = doseFromLegacyLine(oldLine(d));
        expect(read).toEqual({
          holdSeconds: d.holdSeconds,
          repetitions: d.repetitions,
          sets: d.sets,
          durationMinutes: null,
          overnight: false,
          timesPerDay: d.per === 'day' ? d.times : 1,
          daysPerWeek: d.per === 'day' ? 7 : d.times,
          note: d.caution === '' ? '' : `caution: ${d.caution}`,
        });
      }),
    );
  });

  it('gives no dose for free text written elsewhere, nor for parts out of order', () => {
    expect(doseFromLegacyLine('3 × 30 s each side')).toBeNull();
    expect(doseFromLegacyLine('nightly as tolerated')).toBeNull();
    expect(doseFromLegacyLine('2 sets of 8')).toBeNull();
    expect(doseFromLegacyLine('2 sets · hold 30 s · 1 time a day')).toBeNull();
    expect(doseFromLegacyLine('hold 30 s')).toBeNull();
    expect(doseFromLegacyLine('')).toBeNull();
  });
});

describe('exercise plan', () => {
  const plan = { title: 'Morning stretches', exercises: [calf], startsOn: '2025-03-05', endsOn: null };

  it('counts exercise sessions in a full week (hand-worked)', () => {
    // 2 a day × 7 = 14, splint each night 7, on 3 days a week once 3, free text 0: 24.
    expect(sessionsInFullWeek([calf, splint, { ...calf, dose: dose({ repetitions: 5, daysPerWeek: 3 }) }, freeText])).toBe(24);
  });

  it('accepts a sound plan and refuses bad ones, naming the field', () => {
    expect(checkExercisePlan(plan).ok).toBe(true);
    expect(checkExercisePlan({ ...plan, exercises: [freeText] }).ok).toBe(true);
    const bad = (p: unknown) => {
      const r = checkExercisePlan(p);
      return r.ok ? [] : r.issues.map((i) => i.path);
    };
    expect(bad({ ...plan, exercises: [] })).toContain('exercises');
    expect(bad({ ...plan, endsOn: '2025-03-01' })).toContain('endsOn');
    expect(bad({ ...plan, exercises: [{ ...calf, dose: dose({ timesPerDay: 7 }) }] })).toContain('exercises.0.dose.timesPerDay');
    // No dose and no text: a dosage would have to be invented, so it is refused.
    expect(bad({ ...plan, exercises: [{ ...freeText, dosageText: '  ' }] })).toContain('exercises.0.dose');
    // 4 exercises twice a day = 56 sessions a week, over the domain's 50.
    expect(bad({ ...plan, exercises: [calf, calf, calf, calf] })).toContain('exercises');
    expect(bad({ ...plan, extra: 1 })).toContain('extra');
  });

  it('words a mistyped count plainly (the editor sends what it cannot read as a number as NaN)', () => {
    const issues = (p: unknown) => {
      const r = checkExercisePlan(p);
      return r.ok ? [] : r.issues.map((i) => `${i.path}: ${i.message}`);
    };
    // Expected messages written by hand: a therapist should never read "Expected number but received NaN".
    expect(issues({ ...plan, exercises: [{ ...calf, dose: dose({ repetitions: Number.NaN }) }] })).toEqual(['exercises.0.dose.repetitions: must be a whole number']);
    expect(issues({ ...plan, exercises: [{ ...calf, dose: dose({ sets: 2.5 }) }] })).toEqual(['exercises.0.dose.sets: must be a whole number']);
  });

  it('maps to a valid HomeProgramme and back without loss; free text stays until restructured', () => {
    const mixed = { ...plan, exercises: [calf, splint, freeText] };
    const input = planToProgrammeInput(mixed, '0190f1a2-0000-7000-8000-000000000001');
    expect(input.sessionsPerWeek).toBe(21);
    expect(input.items.map((i) => i.dosage)).toEqual(['', '', '3 × 30 s each side']);
    const record = { ...input, id: '0190f1a2-0000-7000-8000-000000000002', createdAt: '2025-03-01T09:00:00.000Z', updatedAt: '2025-03-01T09:00:00.000Z', deviceId: '0190f1a2-0000-7000-8000-000000000003', clinicianId: '0190f1a2-0000-7000-8000-000000000004', deleted: false };
    expect(v.safeParse(HomeProgrammeSchema, record).success).toBe(true);
    expect(programmeToPlan(record)).toEqual(mixed);
    expect(freeTextExercises(mixed)).toEqual([2]);
    // A restructured exercise drops its earlier text.
    const restructured = planToProgrammeInput({ ...mixed, exercises: [{ ...freeText, dose: dose({ holdSeconds: 30, repetitions: 3, note: 'each side' }) }] }, record.patientId);
    expect(restructured.items[0]!.dosage).toBe('');
  });

  it('reads a record written before v6 (no dose field) as free text', () => {
    const parsed = v.parse(HomeProgrammeSchema, { id: '0190f1a2-0000-7000-8000-000000000002', createdAt: '2025-03-01T09:00:00.000Z', updatedAt: '2025-03-01T09:00:00.000Z', deviceId: '0190f1a2-0000-7000-8000-000000000003', clinicianId: '0190f1a2-0000-7000-8000-000000000004', deleted: false, patientId: '0190f1a2-0000-7000-8000-000000000001', title: 'Old', items: [{ name: 'A', dosage: '2 sets of 8' }], sessionsPerWeek: 5, startsOn: '2025-01-01', endsOn: null });
    expect(parsed.items[0]).toEqual({ name: 'A', dosage: '2 sets of 8', dose: null });
  });
});
