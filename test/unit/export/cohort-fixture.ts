// Small hand-built records for the cohort tests: invented people, ids that are plain labels (the
// export core does not validate records; the store does, and the CLI tests use real bundles).
import type { Assessment, ClinicalEvent, Clinician, Observation, ObservationValue, Patient } from '../../../src/lib/domain';
import type { CohortRecords } from '../../../src/lib/export';
import { deepFreeze } from '../../support/deep-freeze';
import { aPatient, anAssessment, anEvent, anObservation } from '../../support/records';

const stamp = { createdAt: '2025-01-01T00:00:00.000Z', updatedAt: '2025-01-01T00:00:00.000Z', deviceId: 'dev', clinicianId: 'c1', deleted: false };

export function patient(id: string, over: Partial<Patient> = {}): Patient {
  return aPatient({ ...stamp, id, code: 'ABCD-EFGH', birthYear: 1961, ...over });
}

export function clinician(id: string, displayName: string): Clinician {
  return deepFreeze({ ...stamp, id, displayName, profession: 'physiotherapist', registration: null });
}

export function event(id: string, patientId: string, kind: ClinicalEvent['kind'], occurredOn: string, side: ClinicalEvent['side'] = null): ClinicalEvent {
  const toxin = kind === 'botulinum-toxin-injection';
  return anEvent({ ...stamp, id, patientId, kind, occurredOn, side, muscles: toxin ? 'gastrocnemius' : null, dose: toxin ? '100 units' : null });
}

/** Builder: one assessment per call with its observations. */
export class RecordsBuilder {
  readonly patients: Patient[] = [];
  readonly events: ClinicalEvent[] = [];
  readonly assessments: Assessment[] = [];
  readonly observations: Observation[] = [];
  readonly clinicians: Clinician[] = [clinician('c1', 'Ash Thorne'), clinician('c2', 'Bo Linden')];
  #n = 0;

  assess(patientId: string, date: string, items: { measure: string; site: string; side: Observation['side']; value: ObservationValue; mode?: Observation['mode']; instrument?: Observation['instrument'] }[], over: Partial<Assessment> = {}): this {
    const id = `a${++this.#n}`;
    const performedAt = `${date}T10:00:00.000Z`;
    this.assessments.push(anAssessment({ ...stamp, id, patientId, assessorId: 'c1', performedAt, setting: 'clinic', ...over }));
    for (const item of items) {
      this.observations.push(
        anObservation({
          ...stamp,
          id: `o${++this.#n}`,
          patientId,
          assessmentId: id,
          takenAt: performedAt,
          measureCode: item.measure,
          siteCode: item.site,
          side: item.side,
          mode: item.mode ?? null,
          instrument: item.instrument ?? null,
          value: item.value,
        }),
      );
    }
    return this;
  }

  records(): CohortRecords {
    // Copies, frozen: the export core must not change what it is given.
    return deepFreeze({ patients: [...this.patients], events: [...this.events], assessments: [...this.assessments], observations: [...this.observations], clinicians: [...this.clinicians] });
  }
}

const MAS = ['0', '1', '1+', '2', '3', '4'];
export const mas = (grade: string): ObservationValue => ({ kind: 'ordinal', grade, rank: MAS.indexOf(grade) });
export const angle = (angleDeg: number): ObservationValue => ({ kind: 'angle', angleDeg });
export const tardieu = (r1Deg: number, r2Deg: number, quality: number): ObservationValue => ({ kind: 'tardieu', r1Deg, r2Deg, quality, spasticityAngleDeg: r2Deg - r1Deg });

/** A fixed 32-byte key for deterministic tests (never a real export key). */
export const TEST_KEY = Uint8Array.from({ length: 32 }, (_, i) => (i * 37 + 11) & 0xff);
