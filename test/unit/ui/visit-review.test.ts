import { describe, expect, it } from 'vitest';
import type { Observation, ObservationValue } from '../../../src/lib/domain';
import { seriesKey } from '../../../src/lib/stats';
import { anObservation, masGrade } from '../../support/records';
import { readingsForReview, reviewRows } from '../../../src/routes/patients/[id]/assess/visit-review';
import type { VisitReading } from '../../../src/lib/ui/visit-readings';

// Hand-written last-visit records (not produced by the code under test).
const last = (siteCode: string, value: ObservationValue): Observation =>
  anObservation({ createdAt: '2026-10-01T09:00:00.000Z', updatedAt: '2026-10-01T09:00:00.000Z', id: `o-${siteCode}`, takenAt: '2026-10-01T09:00:00.000Z', siteCode, value });
const grade = masGrade;
const today = (siteCode: string, value: ObservationValue) => ({ measureCode: 'mas', siteCode, side: 'left' as const, mode: null, instrument: null, value });

describe('reviewRows: what changed since last time, by the one outcome rule', () => {
  const before = [last('elbow-flexors', grade('1', 1)), last('knee-extensors', grade('1+', 2)), last('knee-flexors', grade('2', 3))];
  const lastBySeries = new Map(before.map((o) => [seriesKey(o), o]));
  const rows = reviewRows(
    lastBySeries,
    [today('elbow-flexors', grade('3', 4)), today('knee-extensors', grade('1+', 2)), today('knee-flexors', grade('1', 1)), today('hip-adductors', grade('1', 1))],
    { takenAt: '2026-11-05T09:00:00.000Z', clinicianId: 'c' },
  );

  // Modified Ashworth has no published MDC; one whole grade step is the threshold in common use
  // (common practice, no source), so 1 → 3 (ranks 1 → 4, lower is better) is a worsening beyond it.
  it('marks a change of at least one grade step as beyond the MDC, in its direction', () => {
    expect(rows[0]).toMatchObject({ last: { value: '1' }, today: '3', beyondMdc: true });
    expect(rows[0]?.verdict?.verdict).toBe('worsened');
    expect(rows[2]?.beyondMdc).toBe(true);
    expect(rows[2]?.verdict?.verdict).toBe('improved');
  });

  it('does not mark an unchanged grade', () => {
    expect(rows[1]).toMatchObject({ last: { value: '1+' }, today: '1+', beyondMdc: false });
    expect(rows[1]?.verdict?.verdict).toBe('no-change');
  });

  it('says a test with no earlier value has nothing to compare', () => {
    expect(rows[3]).toMatchObject({ last: null, verdict: null, beyondMdc: false });
    expect(rows[3]?.mdcLine).toMatch(/nothing to compare/);
  });

  it('uses a team-adopted MDC over the grade-step rule (chooseMdc order)', () => {
    const local = [{ measureCode: 'mas', siteCode: null, value: 4, citation: 'Invented local study' }];
    const judged = reviewRows(lastBySeries, [today('elbow-flexors', grade('3', 4))], { takenAt: '2026-11-05T09:00:00.000Z', clinicianId: 'c', localMdc: local });
    expect(judged[0]?.beyondMdc).toBe(false);
    expect(judged[0]?.mdcLine).toMatch(/Invented local study|team|local/i);
  });
});

describe('reviewRows: no MDC, and the first visit', () => {
  // A Tardieu pair has no published MDC: the catalogue's reason names what was found instead
  // (Ben-Shabat et al. 2013: ICC ≈ .79 for R1/R2), and the review must show it, not "none known".
  const tardieuLast: Observation = { ...last('ankle-soleus', { kind: 'tardieu', r1Deg: -10, r2Deg: 10, quality: 2, spasticityAngleDeg: 20 }), measureCode: 'tardieu' };
  it("shows the catalogue's reason when a test has no MDC", () => {
    const [row] = reviewRows(
      new Map([[seriesKey(tardieuLast), tardieuLast]]),
      [{ measureCode: 'tardieu', siteCode: 'ankle-soleus', side: 'left', mode: null, instrument: null, value: { kind: 'tardieu', r1Deg: -5, r2Deg: 12, quality: 2, spasticityAngleDeg: 17 } }],
      { takenAt: '2026-11-05T09:00:00.000Z', clinicianId: 'c' },
    );
    expect(row?.beyondMdc).toBe(false);
    expect(row?.mdcLine).toMatch(/^MDC: none published for this measure/);
    expect(row?.mdcLine).toContain('Ben-Shabat');
    expect(row?.mdcLine).not.toContain('none known');
  });

  it('says "first visit" when the patient has none earlier, and "new test" when only this test is new', () => {
    const todayRows = [today('elbow-flexors', grade('1', 1))];
    const [first] = reviewRows(new Map(), todayRows, { takenAt: '2026-11-05T09:00:00.000Z', clinicianId: 'c', firstVisit: true });
    expect(first?.lastText).toBe('first visit');
    expect(first?.mdcLine).toMatch(/^First visit/);
    const [later] = reviewRows(new Map(), todayRows, { takenAt: '2026-11-05T09:00:00.000Z', clinicianId: 'c', firstVisit: false });
    expect(later?.lastText).toBe('new test');
    const [carried] = reviewRows(new Map([[seriesKey(last('elbow-flexors', grade('1+', 2))), last('elbow-flexors', grade('1+', 2))]]), todayRows, { takenAt: '2026-11-05T09:00:00.000Z', clinicianId: 'c', firstVisit: false });
    expect(carried?.lastText).toMatch(/^1\+ \(/);
  });
});

describe('readingsForReview: an instrument reading compared with last time', () => {
  it('shows a pendulum test by its R2 against last visit, with the catalogue\'s reason for having no MDC', () => {
    const lastRi: Observation = { ...last('knee', { kind: 'index', value: 1.1 }), measureCode: 'pendulum-ri' };
    const reading: VisitReading = {
      key: 'r1',
      instrument: 'pendulum-file',
      title: 'Pendulum from a file, left knee: R2 1.25',
      skipped: [],
      // Hand-written indices (not from the engine): the first swing comes first, R2 second.
      observations: [
        { measureCode: 'pendulum-first-swing', siteCode: 'knee', side: 'left', mode: null, instrument: null, value: { kind: 'index', value: 61 } },
        { measureCode: 'pendulum-ri', siteCode: 'knee', side: 'left', mode: null, instrument: null, value: { kind: 'index', value: 1.25 } },
      ],
      trace: { kind: 'pendulum-knee-angle', startedAt: '2026-11-05T09:00:00.000Z', sampleRateHz: 100, channels: [] },
    };
    const today = readingsForReview([reading]);
    expect(today.map((o) => o.measureCode)).toEqual(['pendulum-ri']);
    const [row] = reviewRows(new Map([[seriesKey(lastRi), lastRi]]), today, { takenAt: '2026-11-05T09:00:00.000Z', clinicianId: 'c' });
    expect(row?.lastText).toMatch(/^1\.10 \(/);
    expect(row?.today).toBe('1.25');
    expect(row?.beyondMdc).toBe(false);
    // REFERENCES via the catalogue: ICC 0.93 for the first swing angle (J NeuroEng Rehabil 2024, 21:50).
    expect(row?.mdcLine).toContain('ICC 0.93');
  });
});
