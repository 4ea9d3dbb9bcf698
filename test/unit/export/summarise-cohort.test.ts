import { ORDINAL_STEP_MDC } from '../../../src/lib/stats/choose-mdc';
import { describe, expect, it } from 'vitest';
import { quantile as ssQuantile, median as ssMedian } from 'simple-statistics';
import { generateDemoScenario } from '../../../src/lib/demo';
import { findMeasure, referenceMdc95, type Observation } from '../../../src/lib/domain';
import { buildCohortIndex, CohortExportError, selectCohort, summariseCohort, type CohortFilters } from '../../../src/lib/export';
import { cohortChangeSummary } from '../../../src/lib/stats';
import { angle, event, mas, patient, RecordsBuilder } from './cohort-fixture';

const demo = generateDemoScenario({ seed: 3 }).tables;
const index = buildCohortIndex(demo);
const filters: CohortFilters = {};

/** Changes recomputed from the raw records, apart from the module: per series, last − first value. */
function changesByGroup(): Map<string, number[]> {
  const cohort = selectCohort(index, filters);
  const out = new Map<string, number[]>();
  for (const pair of cohort.pairs) {
    const s = pair.series;
    const first = s.observations[pair.baselineIndex] as Observation;
    const last = s.observations[pair.followUpIndex] as Observation;
    const read: Record<string, (o: Observation) => number> = {
      grade: (o) => (o.value.kind === 'ordinal' ? o.value.rank : NaN),
      angle: (o) => (o.value.kind === 'angle' ? o.value.angleDeg : NaN),
      value: (o) => ('value' in o.value ? (o.value.value as number) : NaN),
      'spasticity-angle': (o) => (o.value.kind === 'tardieu' ? o.value.r2Deg - o.value.r1Deg : NaN),
      r1: (o) => (o.value.kind === 'tardieu' ? o.value.r1Deg : NaN),
      r2: (o) => (o.value.kind === 'tardieu' ? o.value.r2Deg : NaN),
      quality: (o) => (o.value.kind === 'tardieu' ? o.value.quality : NaN),
    };
    for (const [key, f] of Object.entries(read)) {
      const change = f(last) - f(first);
      if (Number.isNaN(change)) continue;
      const k = `${s.measure.code}|${s.siteCode}|${s.mode ?? ''}|${key}`;
      out.set(k, [...(out.get(k) ?? []), change]);
    }
  }
  return out;
}

describe('summariseCohort', () => {
  const summary = summariseCohort(selectCohort(index, filters));
  const expected = changesByGroup();

  it('groups every pair and quantity; each group equals cohortChangeSummary of independently computed changes', () => {
    expect(summary.groups.map((g) => g.key).sort()).toEqual([...expected.keys()].sort());
    for (const g of summary.groups) {
      const changes = expected.get(g.key)!;
      // Each pair is counted against its own MDC (they differ when instruments or raters do).
      const perPair = [...g.mdcByPair.values()];
      const thresholds = g.quantity.betterWhen !== 'none' && perPair.every((m) => m) ? perPair.map((m) => m!.value) : null;
      if (g.mdc) expect(thresholds?.every((t) => t === g.mdc!.value)).toBe(true);
      const direct = cohortChangeSummary(changes, g.quantity.betterWhen === 'lower' ? 'lower' : 'higher', thresholds);
      expect(g.summary).toEqual(direct);
      expect(g.pairs).toBe(changes.length);
    }
  });

  it('median and quartiles agree with simple-statistics (an outside implementation of type-7 quantiles)', () => {
    let checked = 0;
    for (const g of summary.groups) {
      const changes = expected.get(g.key)!;
      if (changes.length < 2) continue;
      // simple-statistics quantile() is not type 7; compute type 7 from its sorted input by the R definition.
      const sorted = [...changes].sort((a, b) => a - b);
      const type7 = (p: number) => {
        const h = (sorted.length - 1) * p;
        const lo = Math.floor(h);
        return sorted[lo]! + (h - lo) * ((sorted[Math.min(lo + 1, sorted.length - 1)] ?? 0) - sorted[lo]!);
      };
      expect(g.summary.medianChange).toBeCloseTo(ssMedian(changes), 12);
      expect(g.summary.quartiles[0]).toBeCloseTo(type7(0.25), 12);
      expect(g.summary.quartiles[1]).toBeCloseTo(type7(0.75), 12);
      expect(ssQuantile(changes, 0.5)).toBeCloseTo(g.summary.medianChange, 12);
      checked++;
    }
    expect(checked).toBeGreaterThan(5);
  });

  it('ordinal Modified Ashworth changes are whole grade steps, judged by one whole step (common practice, no catalogue MDC)', () => {
    const masGroups = summary.groups.filter((g) => g.measureCode === 'mas');
    expect(masGroups.length).toBeGreaterThan(0);
    for (const g of masGroups) {
      expect(g.quantity.changeUnit).toBe('grade steps');
      for (const c of g.changes) expect(Number.isInteger(c)).toBe(true);
      expect(g.mdc).toBe(ORDINAL_STEP_MDC);
      expect(g.mdc?.citation).toMatch(/common practice/);
      expect(g.mdcNote).toBeNull();
      // Lower grades are better: improved = fell by at least one whole step.
      const improved = Array.from(g.changes).filter((c) => c <= -1).length;
      expect(g.summary.improvedBeyondMdc?.count).toBe(improved);
    }
  });
});

describe('MDC provenance', () => {
  // Knee flexion by inclinometer has a published MDC in the catalogue (Hancock et al. 2018, 6°).
  function kneeCohort(assessor2: string) {
    const b = new RecordsBuilder();
    const rows: [string, number, number][] = [['k1', 100, 110], ['k2', 95, 99], ['k3', 120, 112], ['k4', 80, 95]];
    for (const [id, before, after] of rows) {
      b.patients.push(patient(id));
      const knee = (deg: number) => ({ measure: 'rom', site: 'knee-flexion', side: 'left' as const, value: angle(deg), mode: 'active' as const, instrument: 'inclinometer' as const });
      b.assess(id, '2025-01-10', [knee(before)]);
      b.assess(id, '2025-03-10', [knee(after)], { assessorId: assessor2 });
    }
    return selectCohort(buildCohortIndex(b.records()), {});
  }

  it('uses the catalogue reference (stating it) when no local value is given', () => {
    const reference = referenceMdc95('rom', 'knee-flexion', { instrument: 'inclinometer', raters: 'same-rater' });
    expect(reference).not.toBeNull();
    const [g] = summariseCohort(kneeCohort('c1')).groups;
    expect(g!.mdc?.source).toBe('reference');
    expect(g!.mdc?.value).toBe(reference!.mdc95);
    expect(g!.mdc?.citation).toContain(reference!.figure.source);
    // Catalogue: minimum significant difference 6° for knee angle by inclinometer (Hancock et al. 2018,
    // REFERENCES.md §10b, VERIFIED abstract). Changes +10, +4, −8, +15 (higher is better): 2 of 4 ≥ 6°.
    expect(g!.mdc?.value).toBe(6);
    expect(g!.summary.improvedBeyondMdc?.count).toBe(2);
  });

  it('a local study value wins over the reference, site-specific before measure-wide', () => {
    const cohort = kneeCohort('c2');
    const [g] = summariseCohort(cohort, {
      localMdc: [
        { measureCode: 'rom', siteCode: null, value: 20, citation: 'clinic study 2024 (all sites)' },
        { measureCode: 'rom', siteCode: 'knee-flexion', value: 9, citation: 'clinic study 2024 (knee)' },
      ],
    }).groups;
    expect(g!.mdc).toEqual({ value: 9, source: 'local', citation: 'clinic study 2024 (knee)' });
    expect(g!.summary.improvedBeyondMdc?.count).toBe(2); // +10 and +15
    expect(() => summariseCohort(cohort, { localMdc: [{ measureCode: 'rom', siteCode: null, value: 0, citation: 'x' }] })).toThrow(CohortExportError);
  });

  it('a local MDC in grade steps counts Modified Ashworth improvement of at least one grade', () => {
    const b = new RecordsBuilder();
    const grades: [string, string][] = [['3', '1+'], ['2', '2'], ['1+', '1'], ['2', '3']];
    grades.forEach(([before, after], i) => {
      const id = `m${i}`;
      b.patients.push(patient(id));
      b.events.push(event(`e${i}`, id, 'botulinum-toxin-injection', '2025-02-01', 'left'));
      b.assess(id, '2025-01-20', [{ measure: 'mas', site: 'elbow-flexors', side: 'left', value: mas(before) }]);
      b.assess(id, '2025-03-20', [{ measure: 'mas', site: 'elbow-flexors', side: 'left', value: mas(after) }]);
    });
    const cohort = selectCohort(buildCohortIndex(b.records()), { anchor: { kind: 'botulinum-toxin-injection', windowStartDay: 42, windowEndDay: 84 } });
    const [g] = summariseCohort(cohort, { localMdc: [{ measureCode: 'mas', siteCode: null, value: 1, citation: 'one grade step (local agreement study)' }] }).groups;
    // Ranks: 3→1+ is 4→2 (−2), 2→2 (0), 1+→1 is 2→1 (−1), 2→3 is 3→4 (+1).
    expect([...g!.changes]).toEqual([-2, 0, -1, 1]);
    expect(g!.summary.improvedBeyondMdc?.count).toBe(2);
    expect(findMeasure('mas')?.kind).toBe('ordinal');
  });
});
