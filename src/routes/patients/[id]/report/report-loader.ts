import type { AdherenceEntry, Assessment, ClinicalEvent, Clinician, Observation, Patient } from '$lib/domain';
import { defaultReportEvent } from '$lib/export';
import { adherenceByWeek, type RecordedWeek } from '$lib/programme';
import type { LocalMdc } from '$lib/stats';
import { localMdcList, session } from '$lib/ui';

/** What the referral report is made from: one patient's records as this device holds them. */
export interface ReportSources {
  /** null when no live patient has this id on this device. */
  readonly patient: Patient | null;
  /** Name and date of birth, only while the vault is unlocked and a name is recorded. */
  readonly identity: { readonly name: string; readonly dateOfBirth: string | null } | null;
  readonly events: ClinicalEvent[];
  readonly assessments: Assessment[];
  readonly observations: Observation[];
  readonly clinicians: Clinician[];
  readonly weeks: RecordedWeek[];
  readonly localMdc: LocalMdc[];
}

/**
 * Reads the records of the report for patient `id` (events and assessments redacted as the store
 * gives them; tombstoned events left out). Throws what the store throws.
 */
export async function loadReportSources(id: string): Promise<ReportSources> {
  const store = await session.open();
  const row = await store.patients.get(id);
  const [ev, as, ob, cl, ad] = await Promise.all([
    store.events.byPatient(id),
    store.assessments.byPatient(id),
    store.observations.byPatient(id),
    store.clinicians.list(),
    store.adherenceEntries.byPatient(id),
  ]);
  let identity: ReportSources['identity'] = null;
  if (store.vault.status === 'unlocked') {
    const person = await store.identities.forPatient(id);
    if (person) identity = { name: `${person.givenName} ${person.familyName}`, dateOfBirth: person.dateOfBirth };
  }
  return {
    patient: row && !row.deleted ? (row as Patient) : null,
    identity,
    events: ev.map((e) => store.events.redact(e)).filter((e): e is ClinicalEvent => e !== null && !e.deleted),
    assessments: as.map((a) => store.assessments.redact(a)).filter((a): a is Assessment => a !== null),
    observations: ob as Observation[],
    clinicians: cl as Clinician[],
    weeks: adherenceByWeek(ad as AdherenceEntry[]),
    localMdc: await localMdcList(store),
  };
}

/** The scope choice a report opens with: "event:<id>" of the default event (latest injection, else latest event), else "period". */
export function defaultScopeChoice(events: readonly ClinicalEvent[]): string {
  const anchor = defaultReportEvent(events);
  return anchor ? `event:${anchor.id}` : 'period';
}
