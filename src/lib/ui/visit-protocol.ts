import { findMeasure, type Assessment, type Instrument, type Observation, type ObservationValue, type RomMode } from '$lib/domain';
import { seriesKey } from '$lib/stats';
import { allRows, type AssessmentDraft, type InstrumentRow } from './assessment-draft';
import { FORM_MEASURES as LAID_OUT, RATING_MEASURES, ROW_MEASURES, newRow, rowMeasure } from './visit-form-layout';
import type { VisitReading } from './visit-readings';

/**
 * A patient's visit protocol: the tests of the last visit (measure, site, side, ROM mode and
 * instrument), laid out ready in the next visit's form with their previous values, so that the
 * same muscles continue their series instead of silently starting new ones.
 */
export interface ProtocolTest {
  readonly measureCode: string;
  readonly siteCode: string;
  readonly side: Observation['side'];
  readonly mode: RomMode | null;
  readonly instrument: Instrument | null;
  /**
   * Taken with an instrument from within the visit (absent: a row of the form): a pendulum test
   * (file or phone; measureCode 'pendulum-ri', the knee) or a phone inclinometer ROM reading.
   */
  readonly reading?: InstrumentRow['kind'];
}

/** The pendulum test's primary index: the series a carried pendulum row shows "last time" from. */
export const PENDULUM_PRIMARY = 'pendulum-ri';
const isPendulum = (measureCode: string) => measureCode.startsWith('pendulum-');

/**
 * The instrument reading an observation comes from, if any: every pendulum index, and a range of
 * motion with a raw trace (the phone inclinometer). A typed ROM value has no trace.
 */
function readingKind(o: Pick<Observation, 'measureCode' | 'traceId'>): InstrumentRow['kind'] | null {
  if (isPendulum(o.measureCode)) return 'pendulum';
  if (o.measureCode === 'rom' && o.traceId !== null) return 'inclinometer';
  return null;
}

/** Measures the visit form lays out (catalogue entries with a `form`); instrument readings (pendulum) come from their own flows. */
const FORM_MEASURES: readonly string[] = LAID_OUT.map((m) => m.code);

/** Calendar day of an assessment in the device's time zone (visits are days as the therapist sees them). */
function localDay(iso: string): string {
  const d = new Date(iso);
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
}

/**
 * The tests of the patient's last visit: every live form observation of the live assessments on the
 * day of the latest assessment that holds any (same-day assessments saved separately in earlier
 * versions count as one visit). Ordered by measure (as in the form), then by catalogue site order,
 * left before right. Empty when the patient has no history.
 */
export function visitProtocol(assessments: readonly Assessment[], observations: readonly Observation[]): ProtocolTest[] {
  const live = observations.filter((o) => !o.deleted && (FORM_MEASURES.includes(o.measureCode) || isPendulum(o.measureCode)));
  const withForm = new Set(live.map((o) => o.assessmentId));
  const candidates = assessments.filter((a) => !a.deleted && withForm.has(a.id));
  if (candidates.length === 0) return [];
  const latest = candidates.reduce((a, b) => (Date.parse(b.performedAt) > Date.parse(a.performedAt) ? b : a));
  const day = localDay(latest.performedAt);
  const visitIds = new Set(candidates.filter((a) => localDay(a.performedAt) === day).map((a) => a.id));
  const tests = new Map<string, ProtocolTest>();
  for (const o of live) {
    if (!visitIds.has(o.assessmentId)) continue;
    const reading = readingKind(o);
    if (reading === 'pendulum') {
      const test: ProtocolTest = { measureCode: PENDULUM_PRIMARY, siteCode: o.siteCode, side: o.side, mode: null, instrument: null, reading };
      tests.set(`${seriesKey(test)}|pendulum`, test);
      continue;
    }
    const key = `${seriesKey(o)}|${reading ?? ''}`;
    if (!tests.has(key)) tests.set(key, { measureCode: o.measureCode, siteCode: o.siteCode, side: o.side, mode: o.mode, instrument: o.instrument, ...(reading ? { reading } : {}) });
  }
  const order = (t: ProtocolTest) => {
    const measureIndex = t.reading === 'pendulum' ? FORM_MEASURES.length : FORM_MEASURES.indexOf(t.measureCode);
    const siteIndex = findMeasure(t.measureCode)?.sites.findIndex((s) => s.code === t.siteCode) ?? 0;
    const sideIndex = t.side === 'left' ? 0 : t.side === 'right' ? 1 : 2;
    return [measureIndex, siteIndex, sideIndex, t.mode === 'active' ? 1 : 0];
  };
  return [...tests.values()].sort((a, b) => {
    const x = order(a);
    const y = order(b);
    for (let i = 0; i < x.length; i++) if (x[i] !== y[i]) return (x[i] as number) - (y[i] as number);
    return 0;
  });
}

/** The latest live observation of every series (keyed by seriesKey), for "last time" beside each row. */
export function lastObservations(observations: readonly Observation[]): Map<string, Observation> {
  const last = new Map<string, Observation>();
  for (const o of observations) {
    if (o.deleted) continue;
    const key = seriesKey(o);
    const held = last.get(key);
    if (!held || Date.parse(o.takenAt) > Date.parse(held.takenAt)) last.set(key, o);
  }
  return last;
}

/** A value in words for "last time": "1+", "R1 −10° · R2 15° · quality 2", "118°", "2". */
export function describeValue(value: ObservationValue): string {
  const deg = (x: number) => `${String(x).replace('-', '−')}°`;
  switch (value.kind) {
    case 'ordinal':
      return value.grade;
    case 'tardieu':
      return `R1 ${deg(value.r1Deg)} · R2 ${deg(value.r2Deg)} · quality ${value.quality}`;
    case 'angle':
      return deg(value.angleDeg);
    case 'index':
      // Pendulum indices: two decimals, as the patient page and the report show them.
      return value.value.toFixed(2);
    default:
      return String(value.value);
  }
}

/**
 * A new visit's form with the protocol's tests laid out (carried rows: site, side, mode and
 * instrument fixed, so the series continue) and no values: the therapist records today's.
 */
export function draftFromProtocol(patientId: string, performedAtLocal: string, protocol: readonly ProtocolTest[], empty: AssessmentDraft): AssessmentDraft {
  const draft: AssessmentDraft = { ...empty, patientId, performedAtLocal, rows: Object.fromEntries(ROW_MEASURES.map((m) => [m.code, []])), ratings: { ...empty.ratings }, notTested: [], instruments: [] };
  protocol.forEach((t, i) => {
    const key = `carried-${i}`;
    const side = t.side === 'right' ? 'right' : 'left';
    const measure = rowMeasure(t.measureCode);
    if (t.reading) draft.instruments?.push({ key, kind: t.reading, siteCode: t.siteCode, side, mode: t.mode });
    else if (measure) draft.rows[measure.code]?.push(newRow(measure, { key, siteCode: t.siteCode, side, carried: true }, { mode: t.mode, instrument: t.instrument }));
  });
  return draft;
}

/** The protocol as kept on this device after a save: the visit it followed, and its tests. */
export interface KeptProtocol {
  readonly afterAssessmentId: string;
  readonly tests: readonly ProtocolTest[];
}

/**
 * The protocol a saved visit leaves for the next: every row of the form, including those marked
 * "Not tested today" (they stay in the protocol), without rows the therapist removed; the spasm
 * ratings when recorded.
 */
export function protocolFromDraft(draft: AssessmentDraft, readings: readonly VisitReading[] = []): ProtocolTest[] {
  const tests: ProtocolTest[] = ROW_MEASURES.flatMap((m) =>
    (draft.rows[m.code] ?? []).map((r) => ({ measureCode: m.code, siteCode: r.siteCode, side: r.side, mode: 'mode' in r ? r.mode : null, instrument: 'instrument' in r ? r.instrument : null })),
  );
  for (const m of RATING_MEASURES) {
    if ((draft.ratings[m.code] ?? null) !== null) tests.push({ measureCode: m.code, siteCode: m.sites[0]?.code ?? '', side: 'none', mode: null, instrument: null });
  }
  // Instrument readings: the rows carried (taken today or not) and any reading taken today.
  for (const r of draft.instruments ?? []) tests.push(instrumentTest(r));
  for (const reading of readings) {
    const row = rowOfReading(reading);
    if (row) tests.push(instrumentTest(row));
  }
  const unique = new Map(tests.map((t) => [`${seriesKey(t)}|${t.reading ?? ''}`, t]));
  return [...unique.values()];
}

function instrumentTest(r: Omit<InstrumentRow, 'key'>): ProtocolTest {
  return r.kind === 'pendulum'
    ? { measureCode: PENDULUM_PRIMARY, siteCode: r.siteCode, side: r.side, mode: null, instrument: null, reading: 'pendulum' }
    : { measureCode: 'rom', siteCode: r.siteCode, side: r.side, mode: r.mode, instrument: 'phone-sensor', reading: 'inclinometer' };
}

/** The instrument row a reading of this visit fulfils (pendulum: its knee; inclinometer: its motion, side and mode). */
export function rowOfReading(reading: VisitReading): Omit<InstrumentRow, 'key'> | null {
  const o = reading.observations[0];
  if (!o || (o.side !== 'left' && o.side !== 'right')) return null;
  if (reading.instrument === 'inclinometer') return { kind: 'inclinometer', siteCode: o.siteCode, side: o.side, mode: o.mode };
  return { kind: 'pendulum', siteCode: o.siteCode, side: o.side, mode: null };
}

/** The reading of this visit that fulfils a carried instrument row, if one was taken. */
export function readingForRow(row: InstrumentRow, readings: readonly VisitReading[]): VisitReading | undefined {
  return readings.find((reading) => {
    const r = rowOfReading(reading);
    return r !== null && r.kind === row.kind && r.siteCode === row.siteCode && r.side === row.side && (row.kind === 'pendulum' || r.mode === row.mode);
  });
}

/** Carried instrument rows neither taken today nor marked "Not tested today": each named, as a blank form row is. */
export function missingReadings(draft: AssessmentDraft, readings: readonly VisitReading[]): Array<{ field: string; message: string }> {
  const skipped = new Set(draft.notTested ?? []);
  return (draft.instruments ?? [])
    .filter((row) => !skipped.has(row.key) && !readingForRow(row, readings))
    .map((row) => ({ field: `instrument-${row.key}`, message: 'not taken yet: take the reading here, or tap "Not tested today"' }));
}

/**
 * The protocol for a new visit: the one kept after the latest visit when it is still the latest
 * live visit (so tests "not tested today" come back next time), else the tests of the last visit as
 * recorded (a visit saved on another device, or none kept).
 */
export function chooseProtocol(kept: KeptProtocol | undefined, assessments: readonly Assessment[], observations: readonly Observation[]): ProtocolTest[] {
  const live = assessments.filter((a) => !a.deleted);
  const keptVisit = kept ? live.find((a) => a.id === kept.afterAssessmentId) : undefined;
  if (kept && keptVisit && live.every((a) => Date.parse(a.performedAt) <= Date.parse(keptVisit.performedAt) || !observations.some((o) => o.assessmentId === a.id && !o.deleted && FORM_MEASURES.includes(o.measureCode)))) {
    return [...kept.tests];
  }
  return visitProtocol(assessments, observations);
}

/** The device-local key under which a patient's protocol is kept. */
export const protocolStateKey = (patientId: string) => `local:visit-protocol-${patientId.toLowerCase()}`;

/** "YYYY-MM-DDTHH:MM" in the device's time zone, as the form's date and time fields hold it. */
export function localDateTime(iso: string): string {
  const d = new Date(iso);
  const two = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${two(d.getMonth() + 1)}-${two(d.getDate())}T${two(d.getHours())}:${two(d.getMinutes())}`;
}

/** The form of a saved visit, to amend it: its conditions and every live form observation, filled. */
export function draftFromVisit(visit: Assessment, observations: readonly Observation[], empty: AssessmentDraft): AssessmentDraft {
  const own = observations.filter((o) => o.assessmentId === visit.id && !o.deleted);
  // Readings stay as saved when a visit is amended: only the form's rows are laid out.
  const draft = draftFromProtocol(visit.patientId, localDateTime(visit.performedAt), visitProtocol([visit], own).filter((t) => !t.reading), empty);
  const c = visit.conditions;
  Object.assign(draft, {
    setting: visit.setting,
    position: c.position ?? '',
    minutesSinceMedication: c.minutesSinceMedication === null ? '' : String(c.minutesSinceMedication),
    painNrs: c.painNrs === null ? '' : String(c.painNrs),
  });
  const valueOf = (measureCode: string, siteCode: string, side: string, mode: string | null = null) =>
    own.find((o) => seriesKey(o) === seriesKey({ measureCode, siteCode, side: side as Observation['side'], mode: mode as Observation['mode'] }))?.value;
  for (const m of ROW_MEASURES) {
    for (const row of draft.rows[m.code] ?? []) {
      const v = valueOf(m.code, row.siteCode, row.side, 'mode' in row ? row.mode : null);
      if ('grade' in row && v?.kind === 'ordinal') row.grade = v.grade;
      else if ('r1Deg' in row && v?.kind === 'tardieu') Object.assign(row, { r1Deg: String(v.r1Deg), r2Deg: String(v.r2Deg), quality: v.quality });
      else if ('angleDeg' in row && v?.kind === 'angle') row.angleDeg = String(v.angleDeg);
    }
  }
  for (const m of RATING_MEASURES) {
    const v = valueOf(m.code, m.sites[0]?.code ?? '', 'none');
    draft.ratings[m.code] = v?.kind === 'rating' ? v.value : null;
  }
  return draft;
}

/** The measures the visit form holds (an amendment never touches other observations of the visit). */
export const VISIT_FORM_MEASURES: readonly string[] = FORM_MEASURES;

/** How many test rows the form holds (none: a first visit may start from a template). */
export const rowCount = (draft: AssessmentDraft): number => allRows(draft).length;
