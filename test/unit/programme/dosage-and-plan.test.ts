import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  checkExercisePlan,
  formatDosage,
  parseDosage,
  planToProgrammeInput,
  programmeToPlan,
  sessionsInFullWeek,
  type Exercise,
} from '../../../src/lib/programme';
import { HomeProgrammeSchema } from '../../../src/lib/domain';
import * as v from 'valibot';

const calf: Exercise = { name: 'Calf stretch against a wall, back heel down', holdSeconds: 30, repetitions: 3, sets: 2, times: 2, per: 'day', caution: 'stop if the knee hurts' };

describe('dosage line', () => {
  it('writes the exact readable line kept in HomeProgramme.items[].dosage', () => {
    expect(formatDosage(calf)).toBe('hold 30 s · 3 repetitions · 2 sets · 2 times a day · caution: stop if the knee hurts');
    expect(formatDosage({ ...calf, holdSeconds: null, repetitions: 1, sets: null, times: 1, per: 'week', caution: '' })).toBe('1 repetition · 1 time a week');
  });

  it('reads back what it wrote, for any dosage (round trip)', () => {
    const caution = fc.stringMatching(/^[a-z ,.'()0-9:-]{0,100}$/).map((s) => s.trim());
    const dosage = fc.record({
      holdSeconds: fc.option(fc.integer({ min: 1, max: 600 }), { nil: null }),
      repetitions: fc.option(fc.integer({ min: 1, max: 100 }), { nil: null }),
      sets: fc.option(fc.integer({ min: 1, max: 20 }), { nil: null }),
      times: fc.integer({ min: 1, max: 6 }),
      per: fc.constantFrom('day' as const, 'week' as const),
      caution,
    });
    fc.assert(
      fc.property(dosage, (d) => {
        const line = formatDosage(d);
        expect(line.length).toBeLessThanOrEqual(200);
        expect(parseDosage(line)).toEqual(d);
      }),
    );
  });

  it('returns null for free text written elsewhere, and for parts out of order', () => {
    expect(parseDosage('3 × 30 s each side')).toBeNull();
    expect(parseDosage('nightly as tolerated')).toBeNull();
    expect(parseDosage('2 sets · hold 30 s · 1 time a day')).toBeNull();
    expect(parseDosage('hold 30 s')).toBeNull(); // how often is required
    expect(parseDosage('')).toBeNull();
  });
});

describe('exercise plan', () => {
  const plan = { title: 'Morning stretches', exercises: [calf], startsOn: '2025-03-05', endsOn: null };

  it('counts exercise sessions in a full week (hand-worked)', () => {
    // 2 a day × 7 = 14, plus 3 a week = 17.
    expect(sessionsInFullWeek([calf, { ...calf, times: 3, per: 'week' }])).toBe(17);
  });

  it('accepts a sound plan and refuses bad ones, naming the field', () => {
    expect(checkExercisePlan(plan).ok).toBe(true);
    const bad = (p: unknown) => {
      const r = checkExercisePlan(p);
      return r.ok ? [] : r.issues.map((i) => i.path);
    };
    expect(bad({ ...plan, exercises: [] })).toContain('exercises');
    expect(bad({ ...plan, endsOn: '2025-03-01' })).toContain('endsOn');
    expect(bad({ ...plan, exercises: [{ ...calf, times: 7, per: 'day' }] })).toContain('exercises.0.times');
    expect(bad({ ...plan, exercises: [{ ...calf, caution: 'a · b' }] })).toContain('exercises.0.caution');
    // 4 exercises twice a day = 56 sessions a week, over the domain's 50.
    expect(bad({ ...plan, exercises: [calf, calf, calf, calf] })).toContain('exercises');
    expect(bad({ ...plan, extra: 1 })).toContain('extra');
  });

  it('maps to a valid HomeProgramme and back without loss', () => {
    const input = planToProgrammeInput(plan, '0190f1a2-0000-7000-8000-000000000001');
    expect(input.sessionsPerWeek).toBe(14);
    const record = { ...input, id: '0190f1a2-0000-7000-8000-000000000002', createdAt: '2025-03-01T09:00:00.000Z', updatedAt: '2025-03-01T09:00:00.000Z', deviceId: '0190f1a2-0000-7000-8000-000000000003', clinicianId: '0190f1a2-0000-7000-8000-000000000004', deleted: false };
    expect(v.safeParse(HomeProgrammeSchema, record).success).toBe(true);
    expect(programmeToPlan(record)).toEqual({ plan, unreadable: [] });
  });

  it('marks items with free-text dosage as unreadable (e.g. the demo caseload)', () => {
    const { plan: read, unreadable } = programmeToPlan({ title: 'Demo', startsOn: '2025-01-01', endsOn: null, items: [{ name: 'A', dosage: '2 sets of 8' }, { name: 'B', dosage: '1 time a day' }] });
    expect(unreadable).toEqual([0]);
    expect(read.exercises[1]).toEqual({ name: 'B', holdSeconds: null, repetitions: null, sets: null, times: 1, per: 'day', caution: '' });
  });
});
