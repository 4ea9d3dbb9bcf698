// Hand-written record builders for unit tests: every field spelled out here once, so a test names only
// what matters to it. The values are plain invented defaults (never produced by the code under test);
// each record comes back frozen (deepFreeze), so code that mutates its input fails loudly.

import type { Assessment, ClinicalEvent, Observation, ObservationValue, Patient } from '../../src/lib/domain';
import { deepFreeze } from './deep-freeze';

/** The fields every record carries, stamped at one invented instant; override any of them. */
export interface RecordStamp {
  readonly createdAt: string;
  readonly updatedAt: string;
  readonly deviceId: string;
  readonly clinicianId: string;
  readonly deleted: boolean;
}

export const STAMP: RecordStamp = deepFreeze({ createdAt: '2026-01-01T00:00:00.000Z', updatedAt: '2026-01-01T00:00:00.000Z', deviceId: 'd', clinicianId: 'c', deleted: false });

/**
 * A patient; defaults: id "p", code K7QM-3XHD, born 1960, stroke, left side affected, active.
 *
 * @example
 * aPatient({ id: 'p2', affectedSides: [] });
 */
export function aPatient(fields: Partial<Patient> = {}): Patient {
  return deepFreeze({ ...STAMP, id: 'p', code: 'K7QM-3XHD', birthYear: 1960, condition: 'stroke', affectedSides: ['left'], status: 'active', ...fields } as Patient);
}

/** An assessment (a visit); defaults: id "a1" of patient "p" at home on 2026-01-10 09:00 UTC, examined by "c", no conditions. */
export function anAssessment(fields: Partial<Assessment> = {}): Assessment {
  return deepFreeze({
    ...STAMP,
    id: 'a1',
    patientId: 'p',
    assessorId: 'c',
    performedAt: '2026-01-10T09:00:00.000Z',
    setting: 'home',
    conditions: { position: null, minutesSinceMedication: null, painNrs: null },
    notes: null,
    ...fields,
  } as Assessment);
}

/** A Modified Ashworth grade as stored: label and rank (0, 1, 1+, 2, 3, 4 → ranks 0 to 5). */
export function masGrade(grade: string, rank: number): ObservationValue {
  return { kind: 'ordinal', grade, rank };
}

/**
 * An observation; defaults: id "o1" of patient "p", assessment "a1", left elbow flexors Modified
 * Ashworth grade 2 (rank 3) on 2026-01-10 09:00 UTC, no mode, instrument or trace.
 *
 * @example
 * anObservation({ id: 'o2', siteCode: 'knee-extensors', value: masGrade('1+', 2) });
 */
export function anObservation(fields: Partial<Observation> = {}): Observation {
  return deepFreeze({
    ...STAMP,
    id: 'o1',
    patientId: 'p',
    assessmentId: 'a1',
    takenAt: '2026-01-10T09:00:00.000Z',
    measureCode: 'mas',
    siteCode: 'elbow-flexors',
    side: 'left',
    mode: null,
    instrument: null,
    value: masGrade('2', 3),
    traceId: null,
    ...fields,
  } as Observation);
}

/** A clinical event; defaults: id "e1" of patient "p", a left botulinum toxin injection of 100 units into biceps on 2026-02-01. */
export function anEvent(fields: Partial<ClinicalEvent> = {}): ClinicalEvent {
  return deepFreeze({
    ...STAMP,
    id: 'e1',
    patientId: 'p',
    kind: 'botulinum-toxin-injection',
    occurredOn: '2026-02-01',
    endsOn: null,
    side: 'left',
    summary: '',
    muscles: 'biceps',
    dose: '100 units',
    notes: null,
    ...fields,
  } as ClinicalEvent);
}
