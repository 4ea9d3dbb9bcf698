import { describe, expect, it, vi } from 'vitest';
import type { Assessment, Measure, Observation, ObservationValue } from '../../../src/lib/domain';
import { anAssessment, anObservation } from '../../support/records';

// "Adding a measure is one catalogue entry": three measures invented for this test only (none is a
// real scale) are added to the catalogue here, and nothing else changes. The visit form's model
// must lay them out (cards, rows, grade buttons with definitions, limits and reference line),
// check them, and carry them to the next visit. Every expected value below is written by hand from
// the invented entries.
const INVENTED = vi.hoisted((): Measure[] => [
  {
    code: 'test-only-tone',
    label: 'Test-only tone 0–3',
    description: 'An invented ordinal scale, 0 to 3, per site and side.',
    kind: 'ordinal',
    unit: '{grade}',
    improvement: 'lower',
    sites: [
      { code: 'test-site-a', label: 'Test site A' },
      { code: 'test-site-b', label: 'Test site B' },
    ],
    lateral: true,
    grades: [
      { label: '0', rank: 0, description: 'Invented: nothing felt' },
      { label: '1', rank: 1, description: 'Invented: a little' },
      { label: '2', rank: 2, description: 'Invented: clearly' },
      { label: '3', rank: 3, description: 'Invented: a lot' },
    ],
    reference: { kind: 'none', reason: 'none: invented for a test' },
    definitionSource: 'Invented for a unit test (no source)',
    caution: null,
    form: { shape: 'grade', heading: 'Test-only tone', name: 'Test tone', siteNoun: 'Test site', addLabel: 'Add a test site' },
  },
  {
    code: 'test-only-reach',
    label: 'Test-only reach angle',
    description: 'An invented angle per site and side.',
    kind: 'angle',
    unit: 'deg',
    improvement: 'higher',
    sites: [{ code: 'test-joint', label: 'Test joint', limits: { min: -5, max: 40, basis: 'invented' }, angleReference: '0° = an invented neutral' }],
    lateral: true,
    limits: { min: -90, max: 90, basis: 'invented' },
    integer: false,
    modes: null,
    instruments: null,
    reference: { kind: 'none', reason: 'none: invented for a test' },
    definitionSource: 'Invented for a unit test (no source)',
    caution: null,
    form: { shape: 'angle', heading: 'Test-only reach', name: 'Test reach', siteNoun: 'Test joint', addLabel: 'Add a test joint' },
  },
  {
    code: 'test-only-rating',
    label: 'Test-only rating 1–3',
    description: 'An invented whole-person rating from 1 to 3.',
    kind: 'rating',
    unit: '{score}',
    improvement: 'lower',
    sites: [{ code: 'whole-body', label: 'Whole body' }],
    lateral: false,
    limits: { min: 1, max: 3, basis: 'invented' },
    integer: true,
    modes: null,
    instruments: null,
    reference: { kind: 'none', reason: 'none: invented for a test' },
    definitionSource: 'Invented for a unit test (no source)',
    caution: null,
    form: { shape: 'rating', section: 'Test-only ratings', name: 'Test rating' },
  },
]);

// The catalogue module with the invented entries appended; findMeasure reads the same list (the real
// one reads a map built from the real list when the module loads).
vi.mock('../../../src/lib/domain/measure-catalogue', async (importOriginal) => {
  const real = await importOriginal<typeof import('../../../src/lib/domain/measure-catalogue')>();
  const catalogue = [...real.MEASURE_CATALOGUE, ...INVENTED];
  return { ...real, MEASURE_CATALOGUE: catalogue, findMeasure: (code: string) => catalogue.find((m) => m.code === code) };
});

const { draftObservations, emptyDraft, upgradeDraft } = await import('../../../src/lib/ui/assessment-draft');
const layout = await import('../../../src/lib/ui/visit-form-layout');
const { draftFromProtocol, draftFromVisit, protocolFromDraft, visitProtocol, VISIT_FORM_MEASURES } = await import('../../../src/lib/ui/visit-protocol');
type GradeRow = import('../../../src/lib/ui/visit-form-layout').GradeRow;
type AngleRow = import('../../../src/lib/ui/visit-form-layout').AngleRow;
type GradeMeasure = import('../../../src/lib/ui/visit-form-layout').GradeMeasure;
type AngleMeasure = import('../../../src/lib/ui/visit-form-layout').AngleMeasure;
type RatingMeasure = import('../../../src/lib/ui/visit-form-layout').RatingMeasure;

const day = '2026-11-20T09:00:00.000Z';
const stamp = { createdAt: day, updatedAt: day };
const visit: Assessment = anAssessment({ ...stamp, id: 'v1', performedAt: day });
const obs = (id: string, measureCode: string, siteCode: string, side: Observation['side'], value: ObservationValue): Observation =>
  anObservation({ ...stamp, id, assessmentId: 'v1', takenAt: day, measureCode, siteCode, side, value });
// A saved visit that used the invented measures (and one real one, to see the order).
const saved = [
  obs('o1', 'test-only-rating', 'whole-body', 'none', { kind: 'rating', value: 2 }),
  obs('o2', 'test-only-reach', 'test-joint', 'right', { kind: 'angle', angleDeg: 12 }),
  obs('o3', 'test-only-tone', 'test-site-b', 'left', { kind: 'ordinal', grade: '2', rank: 2 }),
  obs('o4', 'mas', 'elbow-flexors', 'left', { kind: 'ordinal', grade: '1', rank: 1 }),
];

describe('a measure added to the catalogue only', () => {
  it('gets its card in the form, after the real ones, in catalogue order; a rating joins the card of its section', () => {
    const cards = layout.formSections().map((s) => (s.shape === 'rows' ? `${s.measure.form.heading}: ${s.measure.form.shape}` : `${s.heading}: ${s.measures.map((m) => m.code).join(', ')}`));
    expect(cards).toEqual([
      'Modified Ashworth: grade',
      'Modified Tardieu: tardieu',
      'Range of motion: angle',
      'Spasms: penn-spasm-frequency, spasm-severity',
      'Test-only tone: grade',
      'Test-only reach: angle',
      'Test-only ratings: test-only-rating',
    ]);
    expect(VISIT_FORM_MEASURES).toEqual(['mas', 'tardieu', 'rom', 'penn-spasm-frequency', 'spasm-severity', 'test-only-tone', 'test-only-reach', 'test-only-rating']);
  });

  it('shows its grade buttons with their definitions, its limits with the reference line, and its rating choices', () => {
    const tone = layout.rowMeasure('test-only-tone');
    const reach = layout.rowMeasure('test-only-reach');
    const rating = layout.formMeasure('test-only-rating');
    if (tone?.form.shape !== 'grade' || reach?.form.shape !== 'angle' || rating?.form.shape !== 'rating') throw new Error('invented measures not laid out');
    expect(layout.gradeOptions(tone as GradeMeasure)).toEqual([
      { value: '0', label: '0', hint: 'Invented: nothing felt' },
      { value: '1', label: '1', hint: 'Invented: a little' },
      { value: '2', label: '2', hint: 'Invented: clearly' },
      { value: '3', label: '3', hint: 'Invented: a lot' },
    ]);
    expect(layout.angleNote(reach as AngleMeasure, 'test-joint')).toBe('0° = an invented neutral. Accepted −5° to 40°');
    expect(layout.ratingOptions(rating as RatingMeasure).map((o) => o.value)).toEqual([1, 2, 3]);
    // A new row (the "Add" button): its first site, left, no value; no mode or instrument (it has none).
    expect(layout.newRow(reach, { key: 'k', siteCode: 'test-joint', side: 'left' })).toEqual({ key: 'k', siteCode: 'test-joint', side: 'left', mode: null, instrument: null, angleDeg: '' });
  });

  it("is carried from the last visit as rows with last time's tests, checked against its entry, and carried again", () => {
    const protocol = visitProtocol([visit], saved);
    expect(protocol.map((t) => `${t.measureCode} ${t.side} ${t.siteCode}`)).toEqual(['mas left elbow-flexors', 'test-only-tone left test-site-b', 'test-only-reach right test-joint', 'test-only-rating none whole-body']);
    const draft = draftFromProtocol('p', '2026-12-01T09:30', protocol, emptyDraft('p', ''));
    expect(draft.rows['test-only-tone']).toEqual([{ key: 'carried-1', siteCode: 'test-site-b', side: 'left', carried: true, grade: null }]);
    expect(draft.rows['test-only-reach']).toEqual([{ key: 'carried-2', siteCode: 'test-joint', side: 'right', carried: true, mode: null, instrument: null, angleDeg: '' }]);
    expect(draft.ratings['test-only-rating']).toBeNull();

    // Blank rows are named; a grade off its scale, an angle past the site's limit, a rating past its own are refused.
    const mas = draft.rows.mas as GradeRow[];
    const tone = draft.rows['test-only-tone'] as GradeRow[];
    const reach = draft.rows['test-only-reach'] as AngleRow[];
    mas[0]!.grade = '1';
    expect(draftObservations(draft).issues.map((i) => i.field)).toEqual(['test-only-tone.0.grade', 'test-only-reach.0.angleDeg']);
    tone[0]!.grade = '4';
    reach[0]!.angleDeg = '41';
    draft.ratings['test-only-rating'] = 4;
    expect(draftObservations(draft).issues.map((i) => i.field)).toEqual(['test-only-tone.0.grade', 'test-only-reach.0.angleDeg', 'test-only-rating.value']);

    tone[0]!.grade = '3';
    reach[0]!.angleDeg = '40';
    draft.ratings['test-only-rating'] = 1;
    const { observations, issues } = draftObservations(draft);
    expect(issues).toEqual([]);
    expect(observations.slice(1)).toEqual([
      { measureCode: 'test-only-tone', siteCode: 'test-site-b', side: 'left', mode: null, instrument: null, value: { kind: 'ordinal', grade: '3', rank: 3 } },
      { measureCode: 'test-only-reach', siteCode: 'test-joint', side: 'right', mode: null, instrument: null, value: { kind: 'angle', angleDeg: 40 } },
      { measureCode: 'test-only-rating', siteCode: 'whole-body', side: 'none', mode: null, instrument: null, value: { kind: 'rating', value: 1 } },
    ]);
    // Saved, the rows are the protocol for next time.
    expect(protocolFromDraft(draft).map((t) => `${t.measureCode} ${t.side} ${t.siteCode}`)).toEqual(protocol.map((t) => `${t.measureCode} ${t.side} ${t.siteCode}`));
  });

  it('fills its rows when the saved visit is opened to amend it, and a kept draft from before it existed gains its empty rows', () => {
    const amended = draftFromVisit(visit, saved, emptyDraft('p', ''));
    expect((amended.rows['test-only-tone'] as GradeRow[]).map((r) => r.grade)).toEqual(['2']);
    expect((amended.rows['test-only-reach'] as AngleRow[]).map((r) => r.angleDeg)).toEqual(['12']);
    expect(amended.ratings['test-only-rating']).toBe(2);
    const { notes: _notes, ...kept } = emptyDraft('p', '');
    const before = { ...kept, rows: { mas: [] }, ratings: {} };
    const upgraded = upgradeDraft(before);
    expect(upgraded?.rows['test-only-tone']).toEqual([]);
    expect(upgraded?.ratings['test-only-rating']).toBeNull();
  });
});
