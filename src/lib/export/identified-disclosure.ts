import type { Identity } from '../domain';
import { CohortExportError } from './cohort-export-error';
import type { CohortIndex } from './cohort-index';
import type { DisclosurePlan, PatientView } from './prepare-disclosure';
import type { Cohort } from './select-cohort';

/**
 * The identified branch of prepareDisclosure: patient codes, birth years, real dates, clinicians'
 * display names and record ids as FHIR ids. Throws CohortExportError for a patient without identity.
 */
export function identifiedDisclosure(cohort: Cohort, index: CohortIndex, identitiesHeld: readonly Identity[], zeroDays: ReadonlyMap<string, number>): DisclosurePlan {
  const identities = new Map(identitiesHeld.filter((i) => !i.deleted).map((i) => [i.patientId, i]));
  const patients = new Map<string, PatientView>();
  for (const id of cohort.patientIds) {
    const patient = index.patients.get(id);
    const identity = identities.get(id);
    if (!patient) continue;
    if (!identity) throw new CohortExportError('disclosure.identities', `no identity for patient ${patient.code}; an identified export needs every patient's identity`);
    patients.set(id, { label: patient.code, birthYears: String(patient.birthYear), condition: patient.condition, zeroDay: zeroDays.get(id) ?? 0, offsetDays: 0, fhirUuid: patient.id, identity });
  }
  return {
    kind: 'identified',
    dateMode: 'actual',
    patients,
    clinicianLabel: (cid) => index.clinicians.get(cid)?.displayName ?? cid,
    observationUuid: (_n, observationId) => observationId,
  };
}
