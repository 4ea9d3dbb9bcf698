// Referral reports of the invented demo caseload (the seed the app loads), built as the report page
// builds them: the default scope (latest injection, else latest event) through the demo's last day.
import type { AdherenceEntry, Assessment, ClinicalEvent, Clinician, Observation, Patient } from '../../../src/lib/domain';
import { generateDemoScenario } from '../../../src/lib/demo';
import { clinicianLabel, defaultReportEvent, referralReport, type ReferralReport } from '../../../src/lib/export';
import { adherenceByWeek } from '../../../src/lib/programme';

export const DEMO_SEED = 20261201;
export const DEMO_END = '2026-11-30';

export interface DemoReport {
  readonly report: ReferralReport;
  /** The invented person's name, to check that it appears only when chosen. */
  readonly name: string;
}

/** One report per demo patient; `withName` puts the invented identity in (as when the user ticks the box). */
export function demoReports(withName: boolean): DemoReport[] {
  const t = generateDemoScenario({ seed: DEMO_SEED, endDate: DEMO_END }).tables;
  const clinicians = t.clinicians as Clinician[];
  return (t.patients as Patient[]).map((patient) => {
    const mine = <R extends { patientId: string }>(rows: readonly R[]) => rows.filter((r) => r.patientId === patient.id);
    const events = mine(t.events as ClinicalEvent[]);
    const person = mine(t.identities)[0]!;
    const name = `${person.givenName} ${person.familyName}`;
    const anchor = defaultReportEvent(events);
    const report = referralReport({
      patient,
      identity: withName ? { name, dateOfBirth: person.dateOfBirth } : null,
      observations: mine(t.observations as Observation[]),
      events,
      assessments: mine(t.assessments as Assessment[]),
      clinicians,
      adherence: adherenceByWeek(mine(t.adherenceEntries as AdherenceEntry[])),
      scope: anchor ? { kind: 'since-event', eventId: anchor.id, throughDay: DEMO_END } : { kind: 'period', fromDay: '2025-01-01', throughDay: DEMO_END },
      timeZone: 'Europe/Berlin',
      preparedOn: DEMO_END,
      preparedBy: clinicianLabel(clinicians[0]!),
    });
    return { report, name };
  });
}
