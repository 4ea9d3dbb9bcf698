// The report for the referring clinician, checked against values worked out by hand for an invented
// patient (every expected figure below was computed on paper from the fixture, not by the code).
import { describe, expect, it } from 'vitest';
import type { Assessment, ClinicalEvent, Observation } from '../../../src/lib/domain';
import { referralReport, reportChartGeometry } from '../../../src/lib/export';
import { ReferralReportError, type ReferralReportInput } from '../../../src/lib/export/referral-report';
import { outcomeSeries } from '../../../src/lib/stats';

const stamp = { createdAt: '2026-01-01T00:00:00.000Z', updatedAt: '2026-01-01T00:00:00.000Z', deviceId: 'd1', deleted: false, patientId: 'p1' };
// Four visits; the first three examined by c1, the last by c2 (a different rater).
const visitDays = { A1: '2026-01-10', A2: '2026-02-25', A3: '2026-03-30', A4: '2026-04-27' } as const;
type Visit = keyof typeof visitDays;
const assessments: Assessment[] = (Object.keys(visitDays) as Visit[]).map((id) => ({
  ...stamp,
  clinicianId: 'c1',
  id,
  assessorId: id === 'A4' ? 'c2' : 'c1',
  performedAt: `${visitDays[id]}T00:00:00.000Z`,
  setting: 'clinic',
  conditions: { position: 'supine', minutesSinceMedication: null, painNrs: null },
  notes: null,
}));
let seq = 0;
const obs = (visit: Visit, measureCode: string, siteCode: string, side: Observation['side'], value: Observation['value'], extra: Partial<Observation> = {}): Observation => ({
  ...stamp,
  clinicianId: 'c1', // who typed it; the examiner is the assessment's assessorId
  id: `o${++seq}`,
  assessmentId: visit,
  takenAt: `${visitDays[visit]}T00:00:00.000Z`,
  measureCode,
  siteCode,
  side,
  mode: null,
  instrument: null,
  value,
  traceId: null,
  ...extra,
});
const mas = (visit: Visit, site: string, grade: string, rank: number) => obs(visit, 'mas', site, 'left', { kind: 'ordinal', grade, rank });
const rom = (visit: Visit, angleDeg: number) => obs(visit, 'rom', 'elbow-flexion', 'left', { kind: 'angle', angleDeg }, { mode: 'passive', instrument: 'universal-goniometer' });
const ri = (visit: Visit, value: number) => obs(visit, 'pendulum-ri', 'knee', 'left', { kind: 'index', value });
const observations: Observation[] = [
  mas('A1', 'elbow-flexors', '2', 3),
  mas('A2', 'elbow-flexors', '3', 4),
  mas('A3', 'elbow-flexors', '1+', 2),
  mas('A4', 'elbow-flexors', '1', 1),
  mas('A3', 'wrist-flexors', '1+', 2),
  mas('A4', 'wrist-flexors', '1+', 2),
  rom('A1', 120),
  rom('A2', 110),
  rom('A3', 118),
  rom('A4', 125),
  ri('A2', 1.1),
  ri('A3', 1.18),
  ri('A4', 1.25),
  obs('A1', 'penn-spasm-frequency', 'whole-body', 'none', { kind: 'rating', value: 3 }),
  obs('A3', 'penn-spasm-frequency', 'whole-body', 'none', { kind: 'rating', value: 2 }),
  obs('A1', 'spasm-severity', 'whole-body', 'none', { kind: 'rating', value: 6 }),
  { ...mas('A4', 'elbow-flexors', '4', 5), deleted: true }, // a tombstone never counts
];
const event = (id: string, kind: ClinicalEvent['kind'], occurredOn: string, extra: Partial<ClinicalEvent> = {}): ClinicalEvent => ({
  ...stamp,
  clinicianId: 'c1',
  id,
  kind,
  occurredOn,
  endsOn: null,
  side: 'left',
  summary: '',
  muscles: null,
  dose: null,
  notes: null,
  ...extra,
});
const events: ClinicalEvent[] = [
  event('block', 'therapy-block-start', '2025-11-01'),
  event('bont', 'botulinum-toxin-injection', '2026-03-02', { muscles: 'biceps brachii, brachialis', dose: '200 units (as written)', summary: 'ultrasound guided' }),
  event('splint', 'orthosis', '2026-03-20', { summary: 'night splint' }),
];
const adherence = [
  { weekStart: '2026-02-23', planned: 10, done: 3 },
  { weekStart: '2026-03-02', planned: 10, done: 8 },
  { weekStart: '2026-03-09', planned: 10, done: 10 },
  { weekStart: '2026-03-16', planned: 10, done: 5 },
  { weekStart: '2026-03-23', planned: 0, done: 0 },
  { weekStart: '2026-04-27', planned: 10, done: 7 },
];
const input: ReferralReportInput = {
  patient: { code: 'K7QM-3XHD', birthYear: 1961, condition: 'stroke', affectedSides: ['left'] },
  identity: null,
  observations,
  events,
  assessments,
  clinicians: [
    { id: 'c1', displayName: 'Ada Fenwick', profession: 'physiotherapist' },
    // A display name that already names the profession is not given it twice.
    { id: 'c2', displayName: 'Bo Lindqvist (physician)', profession: 'physician' },
  ],
  adherence,
  scope: { kind: 'since-event', eventId: 'bont', throughDay: '2026-04-30' },
  timeZone: 'Europe/Berlin',
  preparedOn: '2026-04-30',
  preparedBy: 'Ada Fenwick (physiotherapist)',
};

const ARMSTRONG = 'Armstrong AD, MacDermid JC, Chinchalkar S, Stevens RS, King GJW (1998). J Shoulder Elbow Surg 7:573–580';
const NO_MDC_NOTE = 'MDC: none published for this measure; your team can establish one with a reliability study';
const STEP_NOTE = 'MDC of one whole grade step: common practice for ordinal scales; no published MDC exists.';

describe('referralReport since an injection (hand-worked invented patient)', () => {
  const report = referralReport(input);
  const row = (title: string) => {
    const m = report.measures.find((x) => x.title === title);
    if (!m) throw new Error(`no row ${title} in ${report.measures.map((x) => x.title).join(' | ')}`);
    return m;
  };

  it('lists the measures assessed on or after the injection, in catalogue order', () => {
    expect(report.measures.map((m) => m.title)).toEqual([
      'Left elbow flexors · Modified Ashworth Scale',
      'Left wrist flexors · Modified Ashworth Scale',
      'Left knee (leg-drop pendulum) · Pendulum relaxation index (R2)',
      'Left elbow flexion (passive) · Range of motion (goniometry)',
      'Whole body · Penn Spasm Frequency Scale',
    ]);
    // Spasm severity was rated only before the injection.
    expect(report.notRemeasured).toEqual(['Whole body · Spasm severity (0–10 rating)']);
  });

  it('MAS elbow flexors: baseline = last grade before the injection (3, 25 Feb), latest 1 (27 Apr), −3 steps ≥ the one-step rule: improved', () => {
    expect(row('Left elbow flexors · Modified Ashworth Scale')).toMatchObject({
      baselineText: '3',
      baselineDays: ['2026-02-25'],
      latestText: '1',
      latestDay: '2026-04-27',
      changeText: '−3 grade steps',
      mdcText: '1 grade step',
      noteNumber: 1,
      verdict: 'improved',
      sentence: 'Improved from grade 3 to grade 1 (-3 grade steps), beyond measurement error (MDC 1 grade step).',
    });
  });

  it('ROM elbow flexion: 110° → 125° is +15°; two different raters with a universal goniometer → MDC 10° (Armstrong et al. 1998, REFERENCES §10b): improved', () => {
    expect(row('Left elbow flexion (passive) · Range of motion (goniometry)')).toMatchObject({
      baselineText: '110°',
      latestText: '125°',
      changeText: '+15°',
      mdcText: '10°',
      noteNumber: 3,
      verdict: 'improved',
      sentence: 'Improved from 110° to 125° (+15°), beyond measurement error (MDC 10°).',
    });
    expect(report.notes[2]).toBe(`MDC from a published figure: ${ARMSTRONG}; change-for-95-percent-confidence 10; VERIFIED (abstract).`);
  });

  it('pendulum R2 1.10 → 1.25 and Penn 3 → 2 have no known MDC: the change is shown, not judged; each note gives the catalogue\'s reason', () => {
    expect(row('Left knee (leg-drop pendulum) · Pendulum relaxation index (R2)')).toMatchObject({ baselineText: '1.10', latestText: '1.25', changeText: '+0.15', mdcText: 'none', noteNumber: 2, verdict: 'no-mdc' });
    // Penn's baseline is the 10 Jan rating: 25 Feb has none.
    expect(row('Whole body · Penn Spasm Frequency Scale')).toMatchObject({ baselineText: '3', baselineDays: ['2026-01-10'], latestText: '2', changeText: '−1', noteNumber: 4, verdict: 'no-mdc' });
    // The reasons as the catalogue words them: ICC 0.93 for the first swing angle (J NeuroEng Rehabil
    // 2024, 21:50) for the pendulum, ICC 0.91 in chronic SCI (Adams et al. 2007) for Penn.
    expect(report.notes).toEqual([STEP_NOTE, expect.stringMatching(/^MDC: none published .*\. No SEM or MDC in index units .*ICC 0\.93/), expect.stringContaining('Armstrong'), expect.stringMatching(/^MDC: none published .*\. SEM\/MDC not established .*ICC 0\.91/)]);
    expect(report.notes[1]?.startsWith(NO_MDC_NOTE)).toBe(true);
  });

  it('a measure first assessed after the injection is shown but not compared', () => {
    expect(row('Left wrist flexors · Modified Ashworth Scale')).toMatchObject({
      baselineText: null,
      latestText: '1+',
      changeText: '–',
      noteNumber: null,
      verdict: 'not-compared',
      sentence: 'No assessment before the botulinum toxin injection to compare with; latest 1+.',
    });
  });

  it('tally and summary sentence: 2 improved, 2 without MDC, 1 not compared', () => {
    expect(report.tally).toEqual({ improved: 2, 'no-change': 0, worsened: 0, 'no-mdc': 2, 'not-compared': 1 });
    expect(report.summaryText).toBe(
      'Of 4 measures compared with baseline, 2 improved and 0 got worse beyond measurement error; 0 did not change beyond it; for 2 no MDC is known, so the change is shown but not judged.',
    );
  });

  it('interventions, visits and adherence from the injection day through 30 Apr', () => {
    expect(report.fromDay).toBe('2026-03-02');
    expect(report.anchor).toMatchObject({ day: '2026-03-02', label: 'Botulinum toxin injection', muscles: 'biceps brachii, brachialis', dose: '200 units (as written)' });
    expect(report.interventions.map((i) => [i.day, i.label])).toEqual([
      ['2026-03-02', 'Botulinum toxin injection'],
      ['2026-03-20', 'Orthosis'],
    ]);
    expect(report.visits).toEqual([
      { day: '2026-03-30', setting: 'clinic', assessor: 'Ada Fenwick (physiotherapist)' },
      { day: '2026-04-27', setting: 'clinic', assessor: 'Bo Lindqvist (physician)' },
    ]);
    // Weeks of 2 Mar, 9 Mar, 16 Mar, 23 Mar (nothing planned) and 27 Apr: 8+10+5+0+7 = 30 of 10+10+10+0+10 = 40.
    expect(report.adherence).toMatchObject({ planned: 40, done: 30, text: '30 of 40 planned exercise sessions done in full (75 %) over 5 weeks; weekly 50 % to 100 %.' });
    expect(report.adherence?.weeks.map((w) => w.weekStart)).toEqual(['2026-03-02', '2026-03-09', '2026-03-16', '2026-03-23', '2026-04-27']);
  });

  it('is pseudonymous unless a name is given; carries the cautions and a file name', () => {
    expect(report.identity).toBeNull();
    expect(report.patientFacts).toBe('Stroke · born 1961 · affected side: left');
    expect(report.cautions.join(' ')).toMatch(/not a diagnostic device.*licensed clinicians.*local protocols and data-protection law/);
    expect(report.fileName).toBe('kinnote-report-K7QM-3XHD-2026-04-30');
    const named = referralReport({ ...input, identity: { name: 'Erika Beispiel', dateOfBirth: '1961-05-04' } });
    expect(named.identity).toEqual({ name: 'Erika Beispiel', dateOfBirth: '1961-05-04' });
  });

  it('agrees with the patient page: same verdict sentence as outcomeSeries with "last before" the injection over all observations', () => {
    const assessorByAssessment = new Map(assessments.map((a) => [a.id, a.assessorId]));
    const page = outcomeSeries(observations, { baselineRule: { kind: 'lastBeforeEvent', eventMs: Date.parse('2026-03-02T00:00:00Z') }, assessorByAssessment });
    for (const m of report.measures.filter((x) => x.verdict !== 'not-compared')) {
      expect(page.find((s) => s.key === m.key)?.verdict?.text).toBe(m.sentence);
    }
  });

  it('a chart holds the points from the baseline on, with the baseline ± MDC band', () => {
    const chart = row('Left elbow flexors · Modified Ashworth Scale').chart;
    expect(chart.values).toEqual([4, 2, 1]); // ranks of 3, 1+, 1
    expect(chart.baselineIndices).toEqual([0]);
    expect(chart.band).toEqual({ low: 3, high: 5 });
    expect([chart.yMin, chart.yMax]).toEqual([1, 5]);
    expect(chart.eventTimesMs).toEqual([Date.parse('2026-03-02T00:00:00Z'), Date.parse('2026-03-20T00:00:00Z')]);
  });
});

describe('referralReport over a period', () => {
  const report = referralReport({ ...input, scope: { kind: 'period', fromDay: '2026-02-01', throughDay: '2026-03-31' } });
  it('compares the first and last assessment inside the period; same rater → MDC 6° for the goniometer (Armstrong et al. 1998)', () => {
    expect(report.measures.map((m) => [m.title.split(' · ')[0], m.baselineText, m.latestText, m.changeText, m.mdcText, m.verdict])).toEqual([
      ['Left elbow flexors', '3', '1+', '−2 grade steps', '1 grade step', 'improved'],
      ['Left wrist flexors', null, '1+', '–', '–', 'not-compared'],
      ['Left knee (leg-drop pendulum)', '1.10', '1.18', '+0.08', 'none', 'no-mdc'],
      ['Left elbow flexion (passive)', '110°', '118°', '+8°', '6°', 'improved'],
      ['Whole body', null, '2', '–', '–', 'not-compared'],
    ]);
    expect(report.measures[1]?.sentence).toBe('Assessed once in this period (1+); nothing to compare with.');
  });
  it('interventions and adherence weeks touching 1 Feb–31 Mar: 3+8+10+5+0 = 26 of 40', () => {
    expect(report.interventions.map((i) => i.label)).toEqual(['Botulinum toxin injection', 'Orthosis']);
    expect(report.adherence?.text).toBe('26 of 40 planned exercise sessions done in full (65 %) over 5 weeks; weekly 30 % to 100 %.');
    expect(report.scopeText).toBe("Change within 2026-02-01 to 2026-03-31: each measure's first assessment in the period against its latest.");
  });
});

describe('referralReport refuses what it cannot report', () => {
  it.each([
    [{ kind: 'since-event', eventId: 'nope', throughDay: '2026-04-30' }, /scope.eventId "nope"/],
    [{ kind: 'since-event', eventId: 'bont', throughDay: '2026-02-01' }, /before the event/],
    [{ kind: 'period', fromDay: '2026-03-01', throughDay: '2026-02-01' }, /ends \(2026-02-01\) before it starts/],
    [{ kind: 'period', fromDay: '2026-02-30', throughDay: '2026-03-01' }, /scope.fromDay "2026-02-30" is not a calendar day/],
  ] as const)('%o', (scope, message) => {
    expect(() => referralReport({ ...input, scope })).toThrow(ReferralReportError);
    expect(() => referralReport({ ...input, scope })).toThrow(message);
  });
  it('a deleted event cannot anchor a report', () => {
    expect(() => referralReport({ ...input, events: events.map((e) => (e.id === 'bont' ? { ...e, deleted: true } : e)) })).toThrow(/not an event/);
  });
});

describe('reportChartGeometry (hand-worked: 100×40 px box, 4 px padding)', () => {
  const chart = referralReport(input).measures[0]!.chart;
  it('places time linearly (61 days over 92 px) and rank 5 at the top, rank 1 at the bottom (32 px for 4 ranks)', () => {
    const g = reportChartGeometry(chart, { widthPx: 100, heightPx: 40, padPx: 4 });
    // x: 4 + days/61·92 → 0 d: 4; 33 d: 53.77; 61 d: 96.  y: 4 + (5 − rank)/4·32 → rank 4: 12; 2: 28; 1: 36.
    expect(g.dots).toEqual([
      { x: 4, y: 12, baseline: true },
      { x: 53.77, y: 28, baseline: false },
      { x: 96, y: 36, baseline: false },
    ]);
    expect(g.line).toBe('4,12 53.77,28 96,36');
    // Band 3–5 → y 20 down to 4. Events 5 and 23 days after the baseline: 4 + 5/61·92 = 11.54; 4 + 23/61·92 = 38.69.
    expect(g.band).toEqual({ y: 4, height: 16 });
    expect(g.eventXs).toEqual([11.54, 38.69]);
    expect([g.topLabel, g.bottomLabel]).toEqual(['4', '1']);
  });
  it('one point sits in the middle; a box with no room is refused', () => {
    const one = { ...chart, timesMs: [chart.timesMs[0]!], values: [3], baselineIndices: [], band: null, yMin: 3, yMax: 3 };
    expect(reportChartGeometry(one, { widthPx: 100, heightPx: 40, padPx: 4 }).dots).toEqual([{ x: 50, y: 20, baseline: false }]);
    expect(() => reportChartGeometry(chart, { widthPx: 8, heightPx: 40, padPx: 4 })).toThrow(RangeError);
  });
});
