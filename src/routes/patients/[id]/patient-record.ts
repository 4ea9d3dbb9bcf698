// The named loader of one patient's record, shared by the patient page and the referral report.
import type { Assessment, ClinicalEvent, Identity, Observation, Patient } from '$lib/domain';
import type { KinnoteStore } from '$lib/store';
import type { LocalMdc } from '$lib/stats';
import { localMdcList } from '$lib/ui';

/** What both pages read of one patient: live records only, protected text left out (readable while locked). */
export interface PatientRecord {
  /** null when there is no live patient with this id on the device. */
  readonly patient: Patient | null;
  readonly events: ClinicalEvent[];
  readonly assessments: Assessment[];
  readonly observations: Observation[];
  /** MDCs the team adopted from its own reliability studies. */
  readonly localMdc: LocalMdc[];
}

/** Reads one patient's live record (tombstones left out; notes redacted, so it works while locked). */
export async function loadPatientRecord(store: KinnoteStore, patientId: string): Promise<PatientRecord> {
  const row = await store.patients.get(patientId);
  const patient = row && !row.deleted ? (row as Patient) : null;
  const [ev, as, ob] = await Promise.all([store.events.byPatient(patientId), store.assessments.byPatient(patientId), store.observations.byPatient(patientId)]);
  return {
    patient,
    events: ev.map((e) => store.events.redact(e)).filter((e): e is ClinicalEvent => e !== null && !e.deleted),
    assessments: as.map((a) => store.assessments.redact(a)).filter((a): a is Assessment => a !== null && !a.deleted),
    observations: ob as Observation[],
    localMdc: await localMdcList(store),
  };
}

/** The patient's identity in clear while the vault is unlocked; null while locked or when none is kept. */
export async function loadIdentity(store: KinnoteStore, patientId: string): Promise<Identity | null> {
  if (store.vault.status !== 'unlocked') return null;
  return (await store.identities.forPatient(patientId)) ?? null;
}

/** Latest first: events by the day they happened, visits by when they were performed. */
export const eventsLatestFirst = (events: readonly ClinicalEvent[]): ClinicalEvent[] => [...events].sort((a, b) => (a.occurredOn < b.occurredOn ? 1 : -1));
export const visitsLatestFirst = (assessments: readonly Assessment[]): Assessment[] => [...assessments].sort((a, b) => (a.performedAt < b.performedAt ? 1 : -1));
