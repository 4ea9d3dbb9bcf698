import type { Assessment, ClinicalEvent, Clinician, Observation, Patient } from '$lib/domain';
import type { CohortRecords, LocalMdc } from '$lib/export';
import { localMdcList, session } from '$lib/ui';

/**
 * The cohort page's loader: every patient, event, assessment, observation and clinician on the device,
 * with free text left sealed (the cohort never needs it), and the team's adopted MDCs.
 */
export async function loadCohort(): Promise<{ records: CohortRecords; localMdc: LocalMdc[] }> {
  const store = await session.open();
  const [patients, events, assessments, observations, clinicians] = await Promise.all([
    store.patients.list(),
    store.events.list(),
    store.assessments.list(),
    store.observations.list(),
    store.clinicians.list(),
  ]);
  const records: CohortRecords = {
    patients: patients as Patient[],
    events: events.map((e) => store.events.redact(e)).filter((e): e is ClinicalEvent => e !== null),
    assessments: assessments.map((a) => store.assessments.redact(a)).filter((a): a is Assessment => a !== null),
    observations: observations as Observation[],
    clinicians: clinicians as Clinician[],
  };
  return { records, localMdc: await localMdcList(store) };
}
