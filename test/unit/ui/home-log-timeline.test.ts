import { describe, expect, it } from 'vitest';
import type { OutcomeSeries } from '../../../src/lib/stats';
import { anAssessment } from '../../support/records';
import { axisPercent, markRows, timelineRange, visitOutcomes } from '../../../src/routes/patients/[id]/home-log';

// Hand-written series (not produced by the code under test): points by assessment, each with the
// verdict the patient page's rule would have given it (null = baseline, not judged).
type Verdict = 'improved' | 'worsened' | 'no-change' | 'no-mdc' | null;
const aSeries = (points: [string, Verdict][]): Pick<OutcomeSeries, 'points' | 'judgements'> =>
  ({
    points: points.map(([assessmentId], i) => ({ timeMs: i, value: i, text: String(i), observationId: `o${i}`, assessmentId, clinicianId: 'c' })),
    judgements: points.map(([, v]) => (v === null ? null : { verdict: v })),
  }) as unknown as Pick<OutcomeSeries, 'points' | 'judgements'>;

describe('the home-log timeline: each visit with its measured outcomes', () => {
  const visits = [
    anAssessment({ id: 'a3', performedAt: '2026-03-10T09:00:00.000Z' }),
    anAssessment({ id: 'a1', performedAt: '2026-01-05T09:00:00.000Z' }),
    anAssessment({ id: 'a2', performedAt: '2026-02-02T15:30:00.000Z' }),
    anAssessment({ id: 'a4', performedAt: '2026-04-01T09:00:00.000Z' }),
  ];

  it('counts per visit the measures better, worse, within the MDC, without one, and first measured; oldest visit first', () => {
    const series = [
      aSeries([['a1', null], ['a2', 'improved'], ['a3', 'improved']]),
      aSeries([['a1', null], ['a2', 'worsened'], ['a3', 'no-change']]),
      // First measured at the second visit: its own baseline there.
      aSeries([['a2', null], ['a3', 'no-mdc']]),
      // A point of a visit not on this page (deleted, another patient's) is not counted anywhere.
      aSeries([['gone', null], ['a3', 'worsened']]),
    ];
    expect(visitOutcomes(visits, series)).toEqual([
      { assessmentId: 'a1', day: '2026-01-05', measures: 2, better: 0, worse: 0, within: 0, noMdc: 0, baseline: 2 },
      { assessmentId: 'a2', day: '2026-02-02', measures: 3, better: 1, worse: 1, within: 0, noMdc: 0, baseline: 1 },
      { assessmentId: 'a3', day: '2026-03-10', measures: 4, better: 1, worse: 1, within: 1, noMdc: 1, baseline: 0 },
      // A visit with nothing measured stays on the axis with zero measures.
      { assessmentId: 'a4', day: '2026-04-01', measures: 0, better: 0, worse: 0, within: 0, noMdc: 0, baseline: 0 },
    ]);
  });

  it('puts visits, adherence weeks and ratings on one axis from the earliest to the latest day', () => {
    const log = {
      weeks: [{ weekStart: '2026-01-12', planned: 7, done: 5, share: 5 / 7 }],
      ratings: [{ day: '2026-04-11', penn: 2, severity: 4 }],
    };
    // 2026-01-05 to 2026-04-11: 26 + 28 + 31 + 11 = 96 days (counted on a calendar).
    const range = timelineRange(['2026-02-02', '2026-01-05'], log)!;
    expect(range.to - range.from).toBe(96);
    expect(axisPercent(range, '2026-01-05')).toBe(2);
    expect(axisPercent(range, '2026-04-11')).toBe(98);
    // 2026-02-22 is day 48 of 96: the middle.
    expect(axisPercent(range, '2026-02-22')).toBe(50);
    // The week's last day (start + 6) counts: a lone week spans 7 days, never 0.
    const lone = timelineRange([], { weeks: log.weeks, ratings: [] })!;
    expect(lone.to - lone.from).toBe(7);
    expect(timelineRange([], { weeks: [], ratings: [] })).toBeNull();
  });
});

describe('markRows: marks that would overlap go on another row', () => {
  it('keeps apart marks closer than their widths and reuses the first row that is clear', () => {
    // Widths 2, gap 0.5: a mark needs its centre 2.5 from the previous one on its row (worked by hand).
    const marks = [0, 1, 2, 2.6, 6, 6.4, 6.8].map((at) => ({ at, width: 2 }));
    expect(markRows(marks, 0.5)).toEqual([0, 1, 2, 0, 0, 1, 2]);
    // Far apart: one row.
    expect(markRows([0, 10, 20].map((at) => ({ at, width: 2 })), 0.5)).toEqual([0, 0, 0]);
    expect(markRows([], 0.5)).toEqual([]);
  });
});
