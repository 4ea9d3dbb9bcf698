import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { generateDemoScenario } from '../../../src/lib/demo';
import { EVENT_KINDS, type Observation } from '../../../src/lib/domain';
import { buildCohortIndex, CohortExportError, countCohort, selectCohort, type CohortFilters, type CohortRecords } from '../../../src/lib/export';
import { selectBaseline } from '../../../src/lib/stats/select-baseline';
import { angle, event, mas, patient, RecordsBuilder, tardieu } from './cohort-fixture';

/** The hand-built scenario; expected pairs below are worked out by hand from these dates. */
function scenario(): CohortRecords {
  const b = new RecordsBuilder();
  b.patients.push(patient('p1'), patient('p2', { condition: 'multiple-sclerosis' }), patient('p3'), patient('p4', { deleted: true }));
  b.events.push(event('e1', 'p1', 'botulinum-toxin-injection', '2025-03-10', 'left'), event('e2', 'p2', 'botulinum-toxin-injection', '2025-02-01', 'both'));
  // A later injection of p1: ignored (the first in the date range anchors).
  b.events.push(event('e3', 'p1', 'botulinum-toxin-injection', '2025-06-10', 'left'));
  const ankleL = (grade: string) => ({ measure: 'mas', site: 'ankle-plantarflexors', side: 'left' as const, value: mas(grade) });
  const ankleR = (grade: string) => ({ measure: 'mas', site: 'ankle-plantarflexors', side: 'right' as const, value: mas(grade) });
  b.assess('p1', '2025-01-05', [ankleL('2')]);
  b.assess('p1', '2025-03-01', [ankleL('3'), ankleR('1')], { setting: 'home', assessorId: 'c2' });
  b.assess('p1', '2025-04-01', [ankleL('2')]); // day 22 after the event: before the 42–84 window
  b.assess('p1', '2025-04-25', [ankleL('1+'), ankleR('1')]); // day 46: first in the window
  b.assess('p1', '2025-05-20', [ankleL('1')]); // day 71: in the window
  b.assess('p1', '2025-07-01', [ankleL('1')]); // day 113: after the window
  const soleusR = (r1: number, r2: number) => ({ measure: 'tardieu', site: 'ankle-soleus', side: 'right' as const, value: tardieu(r1, r2, 2) });
  b.assess('p2', '2025-01-20', [soleusR(12, 40)]);
  b.assess('p2', '2025-03-20', [soleusR(20, 42)]); // day 47
  const rom = (deg: number) => ({ measure: 'rom', site: 'hip-flexion', side: 'left' as const, value: angle(deg), mode: 'passive' as const, instrument: 'universal-goniometer' as const });
  b.assess('p3', '2025-02-01', [rom(90)]);
  b.assess('p3', '2025-05-01', [rom(104)]);
  b.assess('p4', '2025-02-01', [rom(90)]);
  b.assess('p4', '2025-05-01', [rom(104)]);
  return b.records();
}

const injection6to12: CohortFilters = { anchor: { kind: 'botulinum-toxin-injection', windowStartDay: 42, windowEndDay: 84 } };

const takenOn = (o: Observation | undefined) => o?.takenAt.slice(0, 10);

describe('selectCohort: event-anchored window (hand-worked dates)', () => {
  const index = buildCohortIndex(scenario());

  it('baseline = last observation before the event, follow-up = first inside the window, only on the event side', () => {
    const cohort = selectCohort(index, injection6to12);
    const summary = cohort.pairs.map((p) => ({
      patient: p.series.patient.id,
      side: p.series.side,
      baseline: takenOn(p.series.observations[p.baselineIndex]),
      followUp: takenOn(p.series.observations[p.followUpIndex]),
      last: takenOn(p.series.observations[p.lastIndex]),
    }));
    expect(summary).toEqual([
      { patient: 'p1', side: 'left', baseline: '2025-03-01', followUp: '2025-04-25', last: '2025-05-20' },
      { patient: 'p2', side: 'right', baseline: '2025-01-20', followUp: '2025-03-20', last: '2025-03-20' },
    ]);
    // p1: 03-01, 04-01, 04-25, 05-20; p2: 01-20, 03-20.
    expect(cohort.observationCount).toBe(6);
    expect(cohort.patientIds).toEqual(['p1', 'p2']);
    expect(countCohort(index, injection6to12)).toEqual({ patients: 2, pairs: 2, observations: 6 });
  });

  it('setting filter applies to every observation: the home visit cannot be the baseline', () => {
    const cohort = selectCohort(index, { ...injection6to12, settings: ['clinic'] });
    const p1 = cohort.pairs.find((p) => p.series.patient.id === 'p1');
    expect(takenOn(p1?.series.observations[p1.baselineIndex])).toBe('2025-01-05');
    expect(countCohort(index, { ...injection6to12, settings: ['clinic'] }).observations).toBe(4 + 2);
    // …and a baseline at most 30 days old then leaves p1 out (01-05 is 64 days before the event).
    const recent = { anchor: { ...injection6to12.anchor!, baselineMaxDaysBefore: 30 }, settings: ['clinic'] as const };
    expect(selectCohort(index, { ...recent, settings: [...recent.settings] }).patientIds).toEqual(['p2']);
  });

  it('clinician, condition, measure, site and side filters', () => {
    expect(countCohort(index, { ...injection6to12, clinicianIds: ['c2'] }).pairs).toBe(0);
    expect(selectCohort(index, { ...injection6to12, conditions: ['multiple-sclerosis'] }).patientIds).toEqual(['p2']);
    expect(countCohort(index, { ...injection6to12, measureCode: 'mas', siteCode: 'ankle-plantarflexors' })).toEqual({ patients: 1, pairs: 1, observations: 4 });
    expect(countCohort(index, { ...injection6to12, side: 'right' })).toEqual({ patients: 1, pairs: 1, observations: 2 });
  });

  it('the date range bounds the anchoring events: a range after the first injection anchors on the second', () => {
    const cohort = selectCohort(index, { ...injection6to12, fromDate: '2025-04-01' });
    // e3 on 2025-06-10: baseline = 05-20 (last before), window 07-22..09-02 holds nothing → no pair.
    expect(cohort.pairs).toEqual([]);
  });
});

describe('selectCohort: no anchor (first and last in the date range)', () => {
  const index = buildCohortIndex(scenario());

  it('pairs every series with two days in range; tombstoned patients never appear', () => {
    const cohort = selectCohort(index, { fromDate: '2025-03-01', toDate: '2025-05-31' });
    const summary = cohort.pairs.map((p) => `${p.series.patient.id} ${p.series.measure.code} ${p.series.side} ${takenOn(p.series.observations[p.baselineIndex])}→${takenOn(p.series.observations[p.followUpIndex])}`);
    expect(summary).toEqual(['p1 mas left 2025-03-01→2025-05-20', 'p1 mas right 2025-03-01→2025-04-25']);
    const all = selectCohort(index, {});
    expect(all.patientIds).toEqual(['p1', 'p2', 'p3']);
  });

  it('refuses malformed filters with the field named', () => {
    expect(() => countCohort(index, { fromDate: '2025-02-30' })).toThrow(CohortExportError);
    expect(() => countCohort(index, { fromDate: '2025-02-30' })).toThrow(/filters\.fromDate/);
    expect(() => countCohort(index, { fromDate: '2025-05-01', toDate: '2025-04-01' })).toThrow(/filters\.toDate/);
    expect(() => countCohort(index, { measureCode: 'nope' })).toThrow(/filters\.measureCode/);
    expect(() => countCohort(index, { measureCode: 'mas', siteCode: 'knee' })).toThrow(/filters\.siteCode/);
    expect(() => countCohort(index, { anchor: { kind: 'surgery', windowStartDay: 10, windowEndDay: 5 } })).toThrow(/filters\.anchor/);
  });

  it('an empty record set gives an empty cohort', () => {
    const empty = buildCohortIndex({ patients: [], events: [], assessments: [], observations: [], clinicians: [] });
    expect(countCohort(empty, {})).toEqual({ patients: 0, pairs: 0, observations: 0 });
  });
});

/**
 * Brute-force oracle written apart from the module: filter observations one by one, group them,
 * and take the baseline with the stats engine's selectBaseline.
 */
function oracle(records: CohortRecords, f: CohortFilters): { patients: number; pairs: number } {
  const day = (iso: string) => Math.floor(Date.parse(iso.length === 10 ? `${iso}T00:00:00Z` : iso) / 86_400_000);
  const live = new Map(records.patients.filter((p) => !p.deleted).map((p) => [p.id, p]));
  const assessments = new Map(records.assessments.filter((a) => !a.deleted).map((a) => [a.id, a]));
  const groups = new Map<string, Observation[]>();
  for (const o of records.observations) {
    const p = live.get(o.patientId);
    const a = assessments.get(o.assessmentId);
    if (o.deleted || !p || !a) continue;
    if (f.conditions?.length && !f.conditions.includes(p.condition)) continue;
    if (f.measureCode && o.measureCode !== f.measureCode) continue;
    if (f.side && o.side !== f.side) continue;
    if (f.settings?.length && !f.settings.includes(a.setting)) continue;
    if (f.clinicianIds?.length && !f.clinicianIds.includes(a.assessorId)) continue;
    if (!f.anchor && ((f.fromDate && day(o.takenAt) < day(f.fromDate)) || (f.toDate && day(o.takenAt) > day(f.toDate)))) continue;
    const key = [o.patientId, o.measureCode, o.siteCode, o.side, o.mode].join('|');
    groups.set(key, [...(groups.get(key) ?? []), o]);
  }
  const patients = new Set<string>();
  let pairs = 0;
  for (const list of groups.values()) {
    list.sort((a, b) => (a.takenAt < b.takenAt ? -1 : a.takenAt > b.takenAt ? 1 : a.id < b.id ? -1 : 1));
    const times = Float64Array.from(list, (o) => day(o.takenAt));
    const values = new Float64Array(list.length); // zeros: every value present
    let ok = false;
    if (!f.anchor) {
      const base = selectBaseline(times, values, { kind: 'first' }, false);
      ok = base !== null && times[times.length - 1]! > times[base.indices[0]!]!;
    } else {
      const o0 = list[0]!;
      const anchor = f.anchor;
      const ev = records.events
        .filter((e) => !e.deleted && e.patientId === o0.patientId && e.kind === anchor.kind)
        .filter((e) => !(f.fromDate && e.occurredOn < f.fromDate) && !(f.toDate && e.occurredOn > f.toDate))
        .filter((e) => !(e.side === 'left' || e.side === 'right') || o0.side === 'none' || o0.side === e.side)
        .sort((a, b) => (a.occurredOn < b.occurredOn ? -1 : a.occurredOn > b.occurredOn ? 1 : a.id < b.id ? -1 : 1))[0];
      if (ev) {
        const eventDay = day(ev.occurredOn);
        const base = selectBaseline(times, values, { kind: 'lastBeforeEvent', eventDay }, false);
        const follow = [...times].some((t) => t >= eventDay + anchor.windowStartDay && t <= eventDay + anchor.windowEndDay);
        ok = base !== null && follow;
      }
    }
    if (ok) {
      pairs++;
      patients.add(list[0]!.patientId);
    }
  }
  return { patients: patients.size, pairs };
}

describe('countCohort agrees with a brute-force oracle on the demo caseload', () => {
  const demo = generateDemoScenario({ seed: 7 }).tables;
  const index = buildCohortIndex(demo);
  const clinicianIds = demo.clinicians.map((c) => c.id);

  it('for random filter combinations (fast-check, seeded)', () => {
    const filters = fc.record({
      fromDate: fc.option(fc.constantFrom('2024-06-01', '2024-10-01', '2025-01-01'), { nil: undefined }),
      toDate: fc.option(fc.constantFrom('2025-03-01', '2025-06-30'), { nil: undefined }),
      conditions: fc.subarray(['stroke', 'multiple-sclerosis', 'spinal-cord-injury', 'cerebral-palsy'] as const),
      measureCode: fc.option(fc.constantFrom('mas', 'tardieu', 'rom', 'pendulum-ri'), { nil: undefined }),
      side: fc.option(fc.constantFrom('left' as const, 'right' as const, 'none' as const), { nil: undefined }),
      settings: fc.subarray(['clinic', 'home', 'remote'] as const),
      clinicianIds: fc.subarray(clinicianIds),
      anchor: fc.option(
        fc.record({ kind: fc.constantFrom(...EVENT_KINDS), windowStartDay: fc.integer({ min: 0, max: 60 }), width: fc.integer({ min: 0, max: 120 }) }).map(({ kind, windowStartDay, width }) => ({ kind, windowStartDay, windowEndDay: windowStartDay + width })),
        { nil: undefined },
      ),
    });
    let nonEmpty = 0;
    fc.assert(
      fc.property(filters, (f) => {
        const filter: CohortFilters = { ...f, conditions: [...f.conditions], settings: [...f.settings], clinicianIds: [...f.clinicianIds] };
        if (filter.fromDate && filter.toDate && filter.fromDate > filter.toDate) return;
        const got = countCohort(index, filter);
        const want = oracle(demo, filter);
        expect({ patients: got.patients, pairs: got.pairs }).toEqual(want);
        const cohort = selectCohort(index, filter);
        expect(cohort.pairs.length).toBe(got.pairs);
        expect(cohort.observationCount).toBe(got.observations);
        if (got.pairs > 0) nonEmpty++;
      }),
      { seed: 20250601, numRuns: 150 },
    );
    // The comparison is not vacuous: a good share of the random filters select someone.
    expect(nonEmpty).toBeGreaterThan(20);
  });

  it('the result does not depend on record order (permutation)', () => {
    const reversed = { ...demo, observations: [...demo.observations].reverse(), events: [...demo.events].reverse(), assessments: [...demo.assessments].reverse() };
    const f = injection6to12;
    expect(countCohort(buildCohortIndex(reversed), f)).toEqual(countCohort(index, f));
  });
});
