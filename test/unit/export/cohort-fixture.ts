// Small hand-built records for the cohort tests: invented people, ids that are plain labels (the
// export core does not validate records; the store does, and the CLI tests use real bundles).
import type { Assessment, ClinicalEvent, Clinician, Observation, ObservationValue, Patient } from '../../../src/lib/domain';
import type { CohortRecords } from '../../../src/lib/export';

const stamp = { createdAt: '2025-01-01T00:00:00.000Z', updatedAt: '2025-01-01T00:00:00.000Z', deviceId: 'dev', clinicianId: 'c1', deleted: false };

export function patient(id: string, over: Partial<Patient> = {}): Patient {
  return { ...stamp, id, code: 'ABCD-EFGH', birthYear: 1961, condition: 'stroke', affectedSides: ['left'], status: 'active', ...over };
}

export function clinician(id: string, displayName: string): Clinician {
  return { ...stamp, id, displayName, profession: 'physiotherapist', registration: null };
}

export function event(id: string, patientId: string, kind: ClinicalEvent['kind'], occurredOn: string, side: ClinicalEvent['side'] = null): ClinicalEvent {
  return { ...stamp, id, patientId, kind, occurredOn, endsOn: null, side, summary: '', muscles: kind === 'botulinum-toxin-injection' ? 'gastrocnemius' : null, dose: kind === 'botulinum-toxin-injection' ? '100 units' : null, notes: null };
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
    this.assessments.push({ ...stamp, id, patientId, assessorId: 'c1', performedAt, setting: 'clinic', conditions: { position: null, minutesSinceMedication: null, painNrs: null }, notes: null, ...over });
    for (const item of items) {
      this.observations.push({
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
        traceId: null,
      });
    }
    return this;
  }

  records(): CohortRecords {
    return { patients: this.patients, events: this.events, assessments: this.assessments, observations: this.observations, clinicians: this.clinicians };
  }
}

const MAS = ['0', '1', '1+', '2', '3', '4'];
export const mas = (grade: string): ObservationValue => ({ kind: 'ordinal', grade, rank: MAS.indexOf(grade) });
export const angle = (angleDeg: number): ObservationValue => ({ kind: 'angle', angleDeg });
export const tardieu = (r1Deg: number, r2Deg: number, quality: number): ObservationValue => ({ kind: 'tardieu', r1Deg, r2Deg, quality, spasticityAngleDeg: r2Deg - r1Deg });

/** A fixed 32-byte key for deterministic tests (never a real export key). */
export const TEST_KEY = Uint8Array.from({ length: 32 }, (_, i) => (i * 37 + 11) & 0xff);
