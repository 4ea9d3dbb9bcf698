import { describe, expect, it } from 'vitest';
import { generateDemoScenario } from '../../../src/lib/demo';
import type { Observation } from '../../../src/lib/domain';
import { buildCohortIndex, measureQuantitiesForTest, pairChange, selectCohort, summariseCohort } from './outcome-agreement-helpers';
import { adoptedLocalMdc, outcomeSeries, seriesKey, type LocalMdc } from '../../../src/lib/stats';

/**
 * Every demo series judged both ways: the patient page's path (outcomeSeries, first assessment as
 * baseline, as the page and the caseload use it) and the cohort's path (selectCohort with no filter,
 * summariseCohort, pairChange with the pair's MDC, as the summary and the wide CSV use it). Baseline,
 * follow-up, change, MDC (value, source and citation) and verdict must agree for every series.
 */
describe('one outcome rule: patient page and cohort agree on every demo series', () => {
  for (const seed of [3, 11, 2026]) {
    it(`seed ${seed}`, () => {
      const tables = generateDemoScenario({ seed }).tables;
      // The demo's own adopted study (if any) plus an invented local MDC for one site, so the local path is exercised.
      const localMdc: LocalMdc[] = [
        ...adoptedLocalMdc(tables.reliabilityStudies),
        { measureCode: 'rom', siteCode: 'knee-extension', value: 4.2, citation: 'invented test study' },
      ];
      const assessorByAssessment = new Map(tables.assessments.map((a) => [a.id, a.assessorId]));
      const liveAssessments = new Set(tables.assessments.filter((a) => !a.deleted).map((a) => a.id));
      const livePatients = new Set(tables.patients.filter((p) => !p.deleted).map((p) => p.id));

      type Judged = { baseline: number; followUp: number; change: number; mdc: unknown; verdict: string };
      const pagePath = new Map<string, Judged>();
      for (const patientId of livePatients) {
        const observations = tables.observations.filter((o: Observation) => o.patientId === patientId && liveAssessments.has(o.assessmentId));
        for (const s of outcomeSeries(observations, { baselineRule: { kind: 'first' }, localMdc, assessorByAssessment })) {
          if (!s.verdict || !s.baseline) continue;
          const dayOf = (ms: number) => Math.floor(ms / 86_400_000);
          // The cohort needs its follow-up on a later day than its baseline; so does a sensible verdict.
          if (dayOf(s.latest.timeMs) <= dayOf(s.points[0]!.timeMs)) continue;
          pagePath.set(`${patientId}|${s.key}`, {
            baseline: s.baseline.low,
            followUp: s.latest.value,
            change: s.verdict.change,
            mdc: s.mdc,
            verdict: s.verdict.verdict,
          });
        }
      }

      const index = buildCohortIndex(tables);
      const cohort = selectCohort(index, {});
      const summary = summariseCohort(cohort, { localMdc });
      const cohortPath = new Map<string, Judged>();
      for (const pair of cohort.pairs) {
        const quantity = measureQuantitiesForTest(pair.series.measure)[0]!;
        const group = summary.byKey.get(`${pair.series.measure.code}|${pair.series.siteCode}|${pair.series.mode ?? ''}|${quantity.key}`)!;
        const mdc = group.mdcByPair.get(pair) ?? null;
        const change = pairChange(pair, quantity, mdc);
        if (change.verdict === 'no-direction') continue;
        cohortPath.set(`${pair.series.patient.id}|${seriesKey(pair.series.observations[0]!)}`, {
          baseline: change.baseline,
          followUp: change.followUp,
          change: change.change,
          mdc,
          verdict: change.verdict,
        });
      }

      expect(cohortPath.size).toBeGreaterThan(50);
      expect([...cohortPath.keys()].sort()).toEqual([...pagePath.keys()].sort());
      for (const [key, fromCohort] of cohortPath) expect({ key, ...pagePath.get(key) }).toEqual({ key, ...fromCohort });
      // The demo must exercise every kind of MDC and verdict, or agreement proves little.
      const sources = new Set([...cohortPath.values()].map((j) => (j.mdc as { source?: string } | null)?.source ?? 'none'));
      expect([...sources].sort()).toEqual(['local', 'none', 'reference', 'rule']);
      const verdicts = new Set([...cohortPath.values()].map((j) => j.verdict));
      for (const v of ['improved', 'no-change', 'no-mdc']) expect(verdicts).toContain(v);
    });
  }
});
