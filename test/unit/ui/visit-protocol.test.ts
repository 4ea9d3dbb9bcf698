import { describe, expect, it } from 'vitest';
import type { Assessment, Observation, ObservationValue } from '../../../src/lib/domain';
import { seriesKey } from '../../../src/lib/stats';
import { draftObservations, emptyDraft, type AssessmentDraft } from '../../../src/lib/ui/assessment-draft';
import type { AngleRow, GradeRow, TardieuRow } from '../../../src/lib/ui/visit-form-layout';
import { anAssessment, anObservation, masGrade } from '../../support/records';
import { chooseProtocol, describeValue, draftFromProtocol, draftFromVisit, lastObservations, missingReadings, protocolFromDraft, readingForRow, visitProtocol } from '../../../src/lib/ui/visit-protocol';
import type { ReadingObservation, VisitReading } from '../../../src/lib/ui/visit-readings';

const reading = (instrument: VisitReading['instrument'], observations: ReadingObservation[]): VisitReading => ({
  key: `${instrument}-${observations[0]?.side}-${observations[0]?.mode}`,
  instrument,
  title: instrument,
  skipped: [],
  observations,
  trace: { kind: 'pendulum-knee-angle', startedAt: '2026-12-08T10:00:00.000Z', sampleRateHz: 100, channels: [] },
});

// Hand-written records (not produced by the code under test): two visits of one patient, the
// second split the old way into a form assessment and a same-day pendulum assessment.
const stamp = { createdAt: '2026-10-01T09:00:00.000Z', updatedAt: '2026-10-01T09:00:00.000Z' };
const visit = (id: string, performedAt: string, deleted = false): Assessment => anAssessment({ ...stamp, deleted, id, performedAt });
let n = 0;
const obs = (assessmentId: string, takenAt: string, measureCode: string, siteCode: string, side: Observation['side'], value: ObservationValue, extra: Partial<Observation> = {}): Observation =>
  anObservation({ ...stamp, id: `o${n++}`, assessmentId, takenAt, measureCode, siteCode, side, value, ...extra });
const grade = masGrade;
// The form's rows of each shape (the draft holds them by measure code).
const mas = (d: AssessmentDraft) => d.rows.mas as GradeRow[];
const tardieu = (d: AssessmentDraft) => d.rows.tardieu as TardieuRow[];
const rom = (d: AssessmentDraft) => d.rows.rom as AngleRow[];

const T1 = '2026-10-01T09:00:00.000Z';
const T2 = '2026-11-05T09:00:00.000Z';
const T2b = '2026-11-05T09:40:00.000Z';
const assessments = [visit('a1', T1), visit('a2', T2), visit('a2b', T2b), visit('gone', '2026-11-20T09:00:00.000Z', true)];
const observations = [
  obs('a1', T1, 'mas', 'hip-adductors', 'left', grade('2', 3)),
  obs('a1', T1, 'mas', 'elbow-flexors', 'right', grade('1', 1)),
  obs('a2', T2, 'mas', 'elbow-flexors', 'right', grade('1+', 2)),
  obs('a2', T2, 'mas', 'ankle-plantarflexors', 'left', grade('2', 3)),
  obs('a2', T2, 'mas', 'elbow-flexors', 'left', grade('0', 0), { deleted: true }),
  obs('a2', T2, 'rom', 'ankle-dorsiflexion', 'left', { kind: 'angle', angleDeg: -10 }, { mode: 'passive', instrument: 'inclinometer' }),
  obs('a2b', T2b, 'tardieu', 'ankle-soleus', 'left', { kind: 'tardieu', r1Deg: -10, r2Deg: 5, quality: 2, spasticityAngleDeg: 15 }),
  obs('a2b', T2b, 'pendulum-ri', 'knee', 'left', { kind: 'index', value: 1.2 }),
  obs('a2', T2, 'penn-spasm-frequency', 'whole-body', 'none', { kind: 'rating', value: 2 }),
  // On a deleted visit: never part of the protocol.
  obs('gone', '2026-11-20T09:00:00.000Z', 'mas', 'wrist-flexors', 'right', grade('3', 4)),
];

describe('visitProtocol', () => {
  it('lays out the tests of the last visit day (same-day assessments together), in form order, its instrument readings last, without deleted rows or deleted visits', () => {
    const tests = visitProtocol(assessments, observations).map((t) => `${t.measureCode} ${t.side} ${t.siteCode} ${t.mode ?? ''} ${t.instrument ?? ''} ${t.reading ?? ''}`.replace(/ +/g, ' ').trim());
    expect(tests).toEqual([
      // Catalogue site order: elbow flexors come before ankle plantarflexors.
      'mas right elbow-flexors',
      'mas left ankle-plantarflexors',
      'tardieu left ankle-soleus',
      'rom left ankle-dorsiflexion passive inclinometer',
      'penn-spasm-frequency none whole-body',
      // The pendulum test of the same day (a separate assessment of the old kind) is carried as a reading to take.
      'pendulum-ri left knee pendulum',
    ]);
  });

  it('is empty for a patient with no history; a visit of instrument readings only carries those readings', () => {
    expect(visitProtocol([], [])).toEqual([]);
    expect(visitProtocol([visit('a2b', T2b)], observations.filter((o) => o.measureCode === 'pendulum-ri'))).toEqual([
      { measureCode: 'pendulum-ri', siteCode: 'knee', side: 'left', mode: null, instrument: null, reading: 'pendulum' },
    ]);
  });

  it('carries a pendulum test (every index one row per knee) and a phone inclinometer reading (ROM with a trace) as readings, a typed ROM as a form row', () => {
    const day = '2026-12-01T10:00:00.000Z';
    const v = visit('r', day);
    const recorded = [
      ...['pendulum-ri', 'pendulum-first-swing', 'pendulum-swing-count'].map((code) => obs('r', day, code, 'knee', 'right', { kind: 'index', value: 1.31 }, { traceId: 't1' })),
      obs('r', day, 'rom', 'knee-flexion', 'right', { kind: 'angle', angleDeg: 112.4 }, { mode: 'passive', instrument: 'phone-sensor', traceId: 't2' }),
      obs('r', day, 'rom', 'knee-flexion', 'left', { kind: 'angle', angleDeg: 120 }, { mode: 'passive', instrument: 'universal-goniometer' }),
    ];
    const protocol = visitProtocol([v], recorded);
    const draft = draftFromProtocol('p', '2026-12-08T10:00', protocol, emptyDraft('p', ''));
    expect(rom(draft).map((r) => `${r.side} ${r.siteCode} ${r.instrument}`)).toEqual(['left knee-flexion universal-goniometer']);
    expect(draft.instruments?.map(({ kind, siteCode, side, mode }) => `${kind} ${side} ${siteCode} ${mode ?? ''}`.trim())).toEqual(['inclinometer right knee-flexion passive', 'pendulum right knee']);
    // Not taken and not marked: named, like a blank form row; "Not tested today" clears it.
    const rows = draft.instruments ?? [];
    expect(missingReadings(draft, []).map((i) => i.field)).toEqual(rows.map((r) => `instrument-${r.key}`));
    expect(missingReadings({ ...draft, notTested: rows.map((r) => r.key) }, [])).toEqual([]);
    // A reading of this visit fulfils its row only when knee (and motion, mode) match.
    const pendulumLeft = reading('pendulum-phone', [{ measureCode: 'pendulum-ri', siteCode: 'knee', side: 'left', mode: null, instrument: null, value: { kind: 'index', value: 1.4 } }]);
    const pendulumRight = reading('pendulum-file', [{ measureCode: 'pendulum-ri', siteCode: 'knee', side: 'right', mode: null, instrument: null, value: { kind: 'index', value: 1.4 } }]);
    const activeKnee = reading('inclinometer', [{ measureCode: 'rom', siteCode: 'knee-flexion', side: 'right', mode: 'active', instrument: 'phone-sensor', value: { kind: 'angle', angleDeg: 100 } }]);
    expect(missingReadings(draft, [pendulumLeft, activeKnee]).length).toBe(2);
    expect(missingReadings(draft, [pendulumRight]).map((i) => i.field)).toEqual([`instrument-${rows[0]?.key}`]);
    expect(readingForRow(rows[1]!, [pendulumLeft, pendulumRight])).toBe(pendulumRight);
    // Saved, the rows and today's new readings are the protocol for next time.
    const next = protocolFromDraft(draft, [pendulumLeft]).filter((t) => t.reading).map((t) => `${t.reading} ${t.side} ${t.siteCode}`);
    expect(next.sort()).toEqual(['inclinometer right knee-flexion', 'pendulum left knee', 'pendulum right knee']);
    // Amending that visit lays out only its form rows: readings stay as saved.
    expect(draftFromVisit(v, recorded, emptyDraft('p', '')).instruments).toEqual([]);
    expect(describeValue({ kind: 'index', value: 1.3149 })).toBe('1.31');
  });
});

describe('lastObservations and describeValue', () => {
  it('keeps the latest live value per series', () => {
    const last = lastObservations(observations);
    expect(last.get('mas|elbow-flexors|right|')?.value).toEqual(grade('1+', 2));
    expect(last.get('mas|hip-adductors|left|')?.value).toEqual(grade('2', 3));
    expect(last.has('mas|elbow-flexors|left|')).toBe(false);
  });

  it('words each kind of value', () => {
    expect(describeValue(grade('1+', 2))).toBe('1+');
    expect(describeValue({ kind: 'tardieu', r1Deg: -10, r2Deg: 5, quality: 2, spasticityAngleDeg: 15 })).toBe('R1 −10° · R2 5° · quality 2');
    expect(describeValue({ kind: 'angle', angleDeg: 118 })).toBe('118°');
    expect(describeValue({ kind: 'rating', value: 2 })).toBe('2');
  });
});

describe('a visit laid out from the protocol', () => {
  const protocol = visitProtocol(assessments, observations);
  const laidOut = () => draftFromProtocol('p', '2026-12-01T10:00', protocol, emptyDraft('p', '2026-12-01T10:00'));

  it('asks for a value or an explicit "not tested today" on every carried row', () => {
    const { observations: out, issues } = draftObservations(laidOut());
    expect(out).toEqual([]);
    expect(issues.map((i) => i.field)).toEqual(['mas.0.grade', 'mas.1.grade', 'tardieu.0.r1Deg', 'rom.0.angleDeg']);
  });

  it('continues the same series: every saved observation has the series key of a protocol test', () => {
    const draft = laidOut();
    mas(draft)[0]!.grade = '1';
    mas(draft)[1]!.grade = '1+';
    tardieu(draft)[0]!.r1Deg = '5';
    tardieu(draft)[0]!.r2Deg = '20';
    tardieu(draft)[0]!.quality = 2;
    draft.notTested = [rom(draft)[0]!.key];
    draft.ratings['penn-spasm-frequency'] = 1;
    const { observations: out, issues } = draftObservations(draft);
    expect(issues).toEqual([]);
    const protocolKeys = new Set(protocol.map((t) => seriesKey(t)));
    expect(out.map((o) => seriesKey(o))).toEqual(['mas|elbow-flexors|right|', 'mas|ankle-plantarflexors|left|', 'tardieu|ankle-soleus|left|', 'penn-spasm-frequency|whole-body|none|']);
    for (const o of out) expect(protocolKeys.has(seriesKey(o))).toBe(true);
    // The row marked "not tested today" is saved nowhere.
    expect(out.some((o) => o.measureCode === 'rom')).toBe(false);
  });
});

describe('the protocol kept after a save', () => {
  const protocol = visitProtocol(assessments, observations);
  const draft = draftFromProtocol('p', '2026-12-01T10:00', protocol, emptyDraft('p', '2026-12-01T10:00'));
  draft.notTested = [rom(draft)[0]!.key];
  mas(draft).splice(1, 1); // removed: leaves the protocol
  draft.ratings['penn-spasm-frequency'] = 1;
  const kept = { afterAssessmentId: 'a3', tests: protocolFromDraft(draft) };
  const a3 = visit('a3', '2026-12-01T10:00:00.000Z');
  const a3obs = obs('a3', '2026-12-01T10:00:00.000Z', 'mas', 'elbow-flexors', 'right', grade('1', 1));

  it('keeps a test "not tested today" and drops a removed one', () => {
    expect(kept.tests.map((t) => seriesKey(t))).toEqual(['mas|elbow-flexors|right|', 'tardieu|ankle-soleus|left|', 'rom|ankle-dorsiflexion|left|passive', 'penn-spasm-frequency|whole-body|none|', 'pendulum-ri|knee|left|']);
  });

  it('is used while its visit is the latest, and given up for a later visit saved elsewhere or when its visit is deleted', () => {
    const withA3 = [...assessments, a3];
    const observationsA3 = [...observations, a3obs];
    expect(chooseProtocol(kept, withA3, observationsA3)).toEqual(kept.tests);
    // Recorded alone, a3 holds one test: the kept protocol is what brings the others back.
    expect(visitProtocol(withA3, observationsA3).length).toBe(1);
    const later = visit('a4', '2026-12-20T10:00:00.000Z');
    const laterObs = obs('a4', '2026-12-20T10:00:00.000Z', 'mas', 'wrist-flexors', 'left', grade('2', 3));
    expect(chooseProtocol(kept, [...withA3, later], [...observationsA3, laterObs]).map((t) => t.siteCode)).toEqual(['wrist-flexors']);
    expect(chooseProtocol(kept, [...assessments, visit('a3', '2026-12-01T10:00:00.000Z', true)], observationsA3)).toEqual(protocol);
    expect(chooseProtocol(undefined, withA3, observationsA3).length).toBe(1);
  });
});
