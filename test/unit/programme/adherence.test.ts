import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { adherenceByWeek, weeklyAdherence, type ExercisePlan } from '../../../src/lib/programme';
import { activeDaysInWeek, plannedSessionsOfExercise } from '../../../src/lib/programme/planned-sessions';
import { followedPlans } from '../../../src/lib/programme/current-plans';
import { type ExerciseTick } from '../../../src/lib/programme/home-log';
import { EMPTY_DOSE } from '../../../src/lib/domain';

const P = '0190f1a2-0000-7000-8000-0000000000aa';
const at = '2025-03-20T10:00:00.000Z';
const tick = (exercise: number, day: string, slot: number, status: ExerciseTick['status']): ExerciseTick => ({
  programmeId: P,
  exercise,
  day,
  slot,
  status,
  reason: status === 'skipped' ? 'too tired' : null,
  recordedAt: at,
});

// Plan starting Wednesday 2025-03-05: A twice a day, B three times a week.
const plan: ExercisePlan = {
  title: 'Stretches',
  startsOn: '2025-03-05',
  endsOn: null,
  exercises: [
    { name: 'A', dose: { ...EMPTY_DOSE, holdSeconds: 30, repetitions: 3, sets: 1, timesPerDay: 2 }, dosageText: '' },
    { name: 'B', dose: { ...EMPTY_DOSE, repetitions: 10, sets: 2, daysPerWeek: 3 }, dosageText: '' },
    // "2 sets of 8" with no frequency: can be ticked, never planned.
    { name: 'C', dose: null, dosageText: '2 sets of 8' },
  ],
};

describe('planned sessions (hand-worked, common practice: pro rata for part weeks)', () => {
  it('counts active days of a part week', () => {
    expect(activeDaysInWeek(plan, '2025-03-03', '2025-03-30')).toBe(5); // Wed–Sun
    expect(activeDaysInWeek(plan, '2025-03-10', '2025-03-12')).toBe(3); // Mon–Wed so far
    expect(activeDaysInWeek({ startsOn: '2025-03-05', endsOn: '2025-03-06' }, '2025-03-03', '2025-03-30')).toBe(2);
    expect(activeDaysInWeek(plan, '2025-02-24', '2025-03-30')).toBe(0);
  });
  const fixtures = [
    { input: { timesPerDay: 2, daysPerWeek: null, days: 5 }, expected: 10, source: 'hand-worked: 2 × 5' },
    { input: { timesPerDay: null, daysPerWeek: 3, days: 7 }, expected: 3, source: 'full week' },
    { input: { timesPerDay: null, daysPerWeek: 3, days: 5 }, expected: 2, source: 'hand-worked: round(15/7 = 2.14)' },
    { input: { timesPerDay: null, daysPerWeek: 3, days: 3 }, expected: 1, source: 'hand-worked: round(9/7 = 1.29)' },
    { input: { timesPerDay: null, daysPerWeek: 3, days: 1 }, expected: 0, source: 'hand-worked: round(3/7 = 0.43)' },
    { input: { timesPerDay: 2, daysPerWeek: 3, days: 7 }, expected: 6, source: 'hand-worked: 2 × 3' },
    { input: { timesPerDay: 2, daysPerWeek: 3, days: 4 }, expected: 3, source: 'hand-worked: round(24/7 = 3.43)' },
    { input: { timesPerDay: null, daysPerWeek: 1, days: 4 }, expected: 1, source: 'hand-worked: round(4/7 = 0.57)' },
    { input: { timesPerDay: 2, daysPerWeek: null, days: 0 }, expected: 0, source: 'no active day' },
    { input: { timesPerDay: null, daysPerWeek: null, days: 7 }, expected: 0, source: 'how often not prescribed' },
  ];
  it.each(fixtures)('$input.timesPerDay a day on $input.daysPerWeek days over $input.days days plans $expected ($source)', ({ input, expected }) => {
    const dose = { ...EMPTY_DOSE, repetitions: 5, timesPerDay: input.timesPerDay, daysPerWeek: input.daysPerWeek };
    expect(plannedSessionsOfExercise({ dose }, input.days)).toBe(expected);
  });
});

describe('weekly adherence from ticks (hand-worked)', () => {
  it('first part week and a full week: capped done, partly and skipped apart', () => {
    const ticks: ExerciseTick[] = [];
    // Week of 3 March (Wed 5 – Sun 9): A done 8 times and partly once; B done 3 times (2 planned) and skipped once.
    const days1 = ['2025-03-05', '2025-03-06', '2025-03-07', '2025-03-08', '2025-03-09'];
    days1.slice(0, 4).forEach((d) => ticks.push(tick(0, d, 1, 'done'), tick(0, d, 2, 'done')));
    ticks.push(tick(0, '2025-03-09', 1, 'partly'));
    ticks.push(tick(1, '2025-03-05', 1, 'done'), tick(1, '2025-03-07', 1, 'done'), tick(1, '2025-03-09', 1, 'done'), tick(1, '2025-03-08', 1, 'skipped'));
    // Week of 10 March: A done every time (14), B skipped 3 times.
    for (let d = 10; d <= 16; d++) ticks.push(tick(0, `2025-03-${d}`, 1, 'done'), tick(0, `2025-03-${d}`, 2, 'done'));
    ticks.push(tick(1, '2025-03-10', 1, 'skipped'), tick(1, '2025-03-12', 1, 'skipped'), tick(1, '2025-03-14', 1, 'skipped'));
    // C has no frequency: its ticks neither plan nor count as done.
    ticks.push(tick(2, '2025-03-06', 1, 'done'), tick(2, '2025-03-11', 1, 'done'));
    // Another programme's tick and a tick before the start are ignored.
    ticks.push({ ...tick(0, '2025-03-11', 1, 'done'), programmeId: '0190f1a2-0000-7000-8000-0000000000bb' }, tick(0, '2025-03-04', 1, 'done'));

    const weeks = weeklyAdherence(plan, P, ticks, '2025-03-16');
    expect(weeks.map((w) => w.weekStart)).toEqual(['2025-03-03', '2025-03-10']);
    // Week 1: planned A 2×5 = 10, B round(3×5/7) = 2 → 12; done 8 + min(3, 2) = 10 → 10/12.
    expect(weeks[0]).toMatchObject({ planned: 12, done: 10, partly: 1, skipped: 1 });
    expect(weeks[0]!.share).toBeCloseTo(10 / 12, 12);
    // Week 2: planned 14 + 3 = 17; done 14 → 14/17.
    expect(weeks[1]).toMatchObject({ planned: 17, done: 14, partly: 0, skipped: 3 });
    expect(weeks[1]!.share).toBeCloseTo(14 / 17, 12);
  });

  it('judges a week in progress on the days so far, and ignores later ticks', () => {
    const ticks = [tick(0, '2025-03-10', 1, 'done'), tick(0, '2025-03-10', 2, 'done'), tick(0, '2025-03-11', 1, 'done'), tick(0, '2025-03-14', 1, 'done')];
    const weeks = weeklyAdherence(plan, P, ticks, '2025-03-12');
    // Through Wednesday: A 2×3 = 6, B round(9/7) = 1 → 7 planned; done 3 (the Friday tick is after today).
    expect(weeks[1]).toMatchObject({ weekStart: '2025-03-10', planned: 7, done: 3 });
  });

  it('edge cases: before the start nothing, no ticks 0 %, ended plan stops', () => {
    expect(weeklyAdherence(plan, P, [], '2025-03-01')).toEqual([]);
    const none = weeklyAdherence(plan, P, [], '2025-03-05');
    expect(none).toEqual([{ weekStart: '2025-03-03', planned: 2, done: 0, partly: 0, skipped: 0, share: 0 }]);
    const ended = weeklyAdherence({ ...plan, endsOn: '2025-03-11' }, P, [], '2025-04-30');
    expect(ended.map((w) => w.weekStart)).toEqual(['2025-03-03', '2025-03-10']);
    expect(ended[1]!.planned).toBe(2 * 2 + 1); // Mon–Tue: A 4, B round(6/7) = 1
  });

  it('share stays within [0, 1] and done never exceeds planned, whatever the ticks', () => {
    const tickArb = fc.record({
      exercise: fc.integer({ min: 0, max: 1 }),
      day: fc.integer({ min: 0, max: 30 }).map((d) => new Date(Date.UTC(2025, 2, 1 + d)).toISOString().slice(0, 10)),
      slot: fc.integer({ min: 1, max: 3 }),
      status: fc.constantFrom('done' as const, 'partly' as const, 'skipped' as const),
    });
    fc.assert(
      fc.property(fc.array(tickArb, { maxLength: 120 }), (raw) => {
        const weeks = weeklyAdherence(plan, P, raw.map((t) => tick(t.exercise, t.day, t.slot, t.status)), '2025-03-31');
        for (const w of weeks) {
          expect(w.done).toBeLessThanOrEqual(w.planned);
          expect(w.share >= 0 && w.share <= 1).toBe(true);
        }
      }),
    );
  });
});

describe('adherence per week from stored entries', () => {
  const entry = (programmeId: string, periodStart: string, planned: number, done: number, updatedAt: string, deleted = false) => ({
    programmeId,
    periodStart,
    sessionsPlanned: planned,
    sessionsDone: done,
    updatedAt,
    deleted,
  });
  it('groups by Monday week, keeps the latest copy per programme, adds programmes (hand-worked)', () => {
    const weeks = adherenceByWeek([
      entry('p1', '2025-03-10', 14, 7, '2025-03-12T10:00:00.000Z'),
      entry('p1', '2025-03-10', 14, 12, '2025-03-16T10:00:00.000Z'), // a later copy of the same week stands
      entry('p2', '2025-03-13', 3, 3, '2025-03-16T10:00:00.000Z'), // Thursday → week of 10 March
      entry('p1', '2025-03-03', 10, 11, '2025-03-09T10:00:00.000Z'), // done above planned is capped
      entry('p1', '2025-03-17', 14, 14, '2025-03-20T10:00:00.000Z', true), // tombstone ignored
    ]);
    expect(weeks).toEqual([
      { weekStart: '2025-03-03', planned: 10, done: 10, share: 1 },
      { weekStart: '2025-03-10', planned: 17, done: 15, share: 15 / 17 },
    ]);
    expect(adherenceByWeek([])).toEqual([]);
  });
});

describe('followed plans', () => {
  const programme = (id: string, createdAt: string, startsOn: string, endsOn: string | null) => ({
    id,
    createdAt,
    deleted: false,
    title: id,
    startsOn,
    endsOn,
    items: [{ name: 'A', dosage: '', dose: { ...EMPTY_DOSE, timesPerDay: 1 } }],
  });
  it('ends an earlier programme the day before a later one starts; free-text ones are followed too', () => {
    const plans = followedPlans([
      programme('p2', '2025-03-20T00:00:00.000Z', '2025-03-24', null),
      programme('p1', '2025-03-01T00:00:00.000Z', '2025-03-05', null),
      { ...programme('p0', '2025-02-01T00:00:00.000Z', '2025-02-01', null), items: [{ name: 'x', dosage: 'as tolerated', dose: null }] },
    ]);
    expect(plans.map((p) => [p.programmeId, p.plan.startsOn, p.plan.endsOn])).toEqual([
      ['p0', '2025-02-01', '2025-03-04'],
      ['p1', '2025-03-05', '2025-03-23'],
      ['p2', '2025-03-24', null],
    ]);
  });

  it('starts no plan before the day the phone received it, so earlier weeks are never counted as missed', () => {
    const plans = followedPlans([programme('p1', '2025-03-01T00:00:00.000Z', '2025-01-06', null)], '2025-03-12');
    expect(plans.map((p) => [p.plan.startsOn, p.plan.endsOn])).toEqual([['2025-03-12', null]]);
    // Hand-worked: only the week of 10 March exists; Wed 12 – Sun 16 is 5 days once a day = 5 planned.
    const weeks = weeklyAdherence(plans[0]!.plan, 'p1', [], '2025-03-16');
    expect(weeks.map((w) => [w.weekStart, w.planned])).toEqual([['2025-03-10', 5]]);
    // A programme that ended before the phone got it is not followed at all.
    expect(followedPlans([programme('p0', '2025-02-01T00:00:00.000Z', '2025-02-01', '2025-02-28')], '2025-03-12')).toEqual([]);
  });
});
