import { findMeasure, type Assessment, type ClinicalEvent, type Clinician, type Measure, type Observation, type Patient } from '../domain';
import { dayOfDate, dayOfInstant } from './calendar-day';
import type { CohortRecords } from './cohort-types';
import { measureQuantities } from './measure-quantities';
import { seriesKey, type SeriesIdentity } from '../stats';

/**
 * One patient's observations of one measure at one site, side and (for range of motion) mode, in
 * time order: the unit a change from baseline is computed on. Columns run parallel.
 */
export interface CohortSeries extends SeriesIdentity {
  readonly patient: Patient;
  readonly observations: readonly Observation[];
  readonly assessments: readonly Assessment[];
  /** UTC day number of each observation. */
  readonly days: Int32Array;
  /** The measure's primary quantity (see measureQuantities) of each observation. */
  readonly primary: Float64Array;
}

/** An event with its UTC day number. */
export interface DatedEvent {
  readonly event: ClinicalEvent;
  readonly day: number;
}

/** Records arranged once for fast, repeated cohort selection and counting. */
export interface CohortIndex {
  readonly series: readonly CohortSeries[];
  readonly patients: ReadonlyMap<string, Patient>;
  readonly clinicians: ReadonlyMap<string, Clinician>;
  /** Non-deleted events per patient, by day ascending. */
  readonly eventsByPatient: ReadonlyMap<string, readonly DatedEvent[]>;
  /**
   * Observations left out because their patient or assessment is missing or deleted, or their
   * measure is not in the catalogue (a bundle from a newer version); the page can say how many.
   */
  readonly unlinkedObservations: number;
}

const byTimeThenId = (a: Observation, b: Observation) =>
  a.takenAt < b.takenAt ? -1 : a.takenAt > b.takenAt ? 1 : a.id < b.id ? -1 : a.id > b.id ? 1 : 0;

/**
 * Arranges records for cohort selection: drops tombstones (deleted: true), groups observations
 * into series by patient, measure, site, side and mode, sorts each by time (then id, so the order
 * never depends on input order), and sorts each patient's events by day. Cost O(n log n) in the
 * number of observations; build it once per data set, then select and count as often as needed.
 * Never throws: unusable observations are counted in `unlinkedObservations`.
 */
export function buildCohortIndex(records: CohortRecords): CohortIndex {
  const patients = new Map<string, Patient>();
  for (const p of records.patients) if (!p.deleted) patients.set(p.id, p);
  const assessments = new Map<string, Assessment>();
  for (const a of records.assessments) if (!a.deleted && patients.has(a.patientId)) assessments.set(a.id, a);
  const clinicians = new Map<string, Clinician>();
  for (const c of records.clinicians) if (!c.deleted) clinicians.set(c.id, c);

  const groups = new Map<string, Observation[]>();
  let unlinkedObservations = 0;
  for (const o of records.observations) {
    if (o.deleted) continue;
    const assessment = assessments.get(o.assessmentId);
    if (!assessment || assessment.patientId !== o.patientId || !findMeasure(o.measureCode)) {
      unlinkedObservations++;
      continue;
    }
    const key = `${o.patientId}|${seriesKey(o)}`;
    const list = groups.get(key);
    if (list) list.push(o);
    else groups.set(key, [o]);
  }

  const series: CohortSeries[] = [];
  for (const list of groups.values()) {
    list.sort(byTimeThenId);
    const first = list[0] as Observation;
    const measure = findMeasure(first.measureCode) as Measure;
    const read = (measureQuantities(measure)[0] as { read: (v: Observation['value']) => number }).read;
    const days = new Int32Array(list.length);
    const primary = new Float64Array(list.length);
    const linked: Assessment[] = new Array(list.length);
    for (let i = 0; i < list.length; i++) {
      const o = list[i] as Observation;
      days[i] = dayOfInstant(o.takenAt);
      primary[i] = read(o.value);
      linked[i] = assessments.get(o.assessmentId) as Assessment;
    }
    series.push({
      patient: patients.get(first.patientId) as Patient,
      measure,
      siteCode: first.siteCode,
      side: first.side,
      mode: first.mode,
      observations: list,
      assessments: linked,
      days,
      primary,
    });
  }
  // A stable order (patient, measure, site, side, mode) makes every export of the same data identical.
  series.sort((a, b) => compareKeys(a, b));

  const eventsByPatient = new Map<string, DatedEvent[]>();
  for (const e of records.events) {
    if (e.deleted || !patients.has(e.patientId)) continue;
    const dated = { event: e, day: dayOfDate(e.occurredOn) };
    const list = eventsByPatient.get(e.patientId);
    if (list) list.push(dated);
    else eventsByPatient.set(e.patientId, [dated]);
  }
  for (const list of eventsByPatient.values()) list.sort((a, b) => a.day - b.day || (a.event.id < b.event.id ? -1 : 1));

  return { series, patients, clinicians, eventsByPatient, unlinkedObservations };
}

function compareKeys(a: CohortSeries, b: CohortSeries): number {
  const ka = [a.patient.id, a.measure.code, a.siteCode, a.side, a.mode ?? ''];
  const kb = [b.patient.id, b.measure.code, b.siteCode, b.side, b.mode ?? ''];
  for (let i = 0; i < ka.length; i++) {
    const x = ka[i] as string;
    const y = kb[i] as string;
    if (x !== y) return x < y ? -1 : 1;
  }
  return 0;
}
