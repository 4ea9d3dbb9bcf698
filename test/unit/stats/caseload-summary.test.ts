import { describe, expect, it } from 'vitest';
import type { Observation, ObservationValue } from '../../../src/lib/domain';
import { caseloadSummary, outcomeSeries, type LocalMdc, type SummaryAssessment } from '../../../src/lib/stats';

/** Seeded generator (mulberry32), so a failure names a case that can be run again. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const GRADES = [['0', 0], ['1', 1], ['1+', 2], ['2', 3], ['3', 4], ['4', 5]] as const;

/**
 * One invented patient's record: irregular visits (gaps of 1-60 days, some on the same day), several
 * assessors, grades that drift with jumps, goniometer angles with ±6° of reading noise, missing
 * tests, tombstoned observations and assessments, a few series measured once only.
 */
function messyPatient(random: () => number, patientId: string) {
  const assessments: SummaryAssessment[] = [];
  const observations: Observation[] = [];
  let t = Date.UTC(2025, 0, 1) + random() * 1e9;
  let grade = Math.floor(random() * 6);
  let angle = -20 + random() * 40;
  const visits = 1 + Math.floor(random() * 45);
  let n = 0;
  const id = () => `0190a000-0000-7000-8000-${patientId.slice(-4)}${String(n++).padStart(8, '0')}`;
  for (let v = 0; v < visits; v++) {
    t += random() < 0.1 ? 0 : (1 + random() * 59) * 86_400_000;
    const takenAt = new Date(Math.round(t)).toISOString();
    const assessment = { id: id(), patientId, assessorId: `c${Math.floor(random() * 3)}`, performedAt: takenAt, deleted: random() < 0.05 };
    assessments.push(assessment);
    grade = Math.max(0, Math.min(5, grade + (random() < 0.3 ? Math.round((random() - 0.5) * 4) : 0)));
    angle += (random() - 0.55) * 8;
    const add = (measureCode: string, siteCode: string, side: Observation['side'], value: ObservationValue, mode: Observation['mode'] = null) => {
      if (random() < 0.15) return; // not tested this visit
      observations.push({
        id: id(), createdAt: takenAt, updatedAt: takenAt, deviceId: 'd', clinicianId: `c${Math.floor(random() * 3)}`, deleted: random() < 0.05, patientId,
        assessmentId: assessment.id, takenAt, measureCode, siteCode, side, mode, instrument: random() < 0.5 ? 'universal-goniometer' : null, value, traceId: null,
      });
    };
    const [label, rank] = GRADES[grade]!;
    add('mas', 'elbow-flexors', 'left', { kind: 'ordinal', grade: label, rank });
    const other = GRADES[Math.max(0, grade - 1)]!;
    add('mas', 'knee-extensors', random() < 0.5 ? 'left' : 'right', { kind: 'ordinal', grade: other[0], rank: other[1] });
    add('rom', 'knee', 'left', { kind: 'angle', angleDeg: Math.round(angle + (random() - 0.5) * 12) }, 'passive');
  }
  return { assessments, observations };
}

describe('caseloadSummary (latest verdicts only) agrees with the full outcomeSeries', () => {
  it('on 300 messy invented patients, with and without an adopted local MDC', () => {
    const random = rng(20261203);
    const localMdcs: (readonly LocalMdc[])[] = [[], [{ measureCode: 'mas', siteCode: null, value: 2, citation: 'invented study for this test' }]];
    let compared = 0;
    let changed = 0;
    for (let p = 0; p < 300; p++) {
      const patientId = `patient-${String(p).padStart(4, '0')}`;
      const { assessments, observations } = messyPatient(random, patientId);
      for (const localMdc of localMdcs) {
        const summary = caseloadSummary(assessments, observations, localMdc);
        // The oracle: every series of the full analysis (as the patient page shows it), read the long way.
        const series = outcomeSeries(observations.filter((o) => !o.deleted), {
          baselineRule: { kind: 'first' },
          localMdc,
          assessorByAssessment: new Map(assessments.map((a) => [a.id, a.assessorId])),
        });
        const beyond = series.filter((s) => s.verdict?.verdict === 'improved' || s.verdict?.verdict === 'worsened');
        expect({ improved: summary.improved, worsened: summary.worsened, changedTitles: summary.changedTitles }, `${patientId} ${localMdc.length}`).toEqual({
          improved: series.filter((s) => s.verdict?.verdict === 'improved').length,
          worsened: series.filter((s) => s.verdict?.verdict === 'worsened').length,
          changedTitles: beyond.map((s) => s.title),
        });
        compared++;
        changed += beyond.length;
      }
    }
    // The cases must exercise both outcomes, else the comparison proves little.
    expect(compared).toBe(600);
    expect(changed).toBeGreaterThan(100);
  });
});
