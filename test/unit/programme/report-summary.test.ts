import { describe, expect, it } from 'vitest';
import { summariseReport } from '../../../src/lib/programme';

const tick = (day: string, status: 'done' | 'partly' | 'skipped') => ({ day, status });
const rating = (reportedOn: string, penn: number | null, severity: number | null, deleted = false) => ({ reportedOn, spasmFrequencyPenn: penn, spasmSeverityNrs: severity, deleted });

describe('a report in the therapist\'s words (hand-worked counts)', () => {
  it('counts days ticked (a day once, however many exercises), ratings and skips, not records', () => {
    const summary = summariseReport({
      exportedAt: '2026-12-02T18:30:00.000Z',
      ticks: [tick('2026-11-20', 'done'), tick('2026-11-20', 'partly'), tick('2026-11-21', 'partly'), tick('2026-11-22', 'skipped'), tick('2026-11-23', 'done')],
      selfReports: [rating('2026-11-19', 2, 5), rating('2026-11-21', null, null), rating('2026-11-24', 1, null), rating('2026-11-25', 3, 6, true)],
    });
    // Days with done or partly: 20, 21, 23 → 3. Ratings: the 19th and the 24th (the 21st is empty, the 25th deleted) → 2.
    expect(summary).toEqual({ madeOn: '2026-12-02', daysTicked: 3, spasmRatings: 2, skipped: 1, from: '2026-11-19', to: '2026-11-24' });
  });

  it('an empty report says nothing happened', () => {
    expect(summariseReport({ exportedAt: '2026-12-02T08:00:00.000Z', ticks: [], selfReports: [] })).toEqual({ madeOn: '2026-12-02', daysTicked: 0, spasmRatings: 0, skipped: 0, from: null, to: null });
  });
});
