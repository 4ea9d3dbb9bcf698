import { EVENT_KIND_LABELS, type Assessment, type ClinicalEvent, type Clinician } from '../domain';
import type { ReportIntervention, ReportVisit } from './referral-report';

/** "Ada Fenwick (physiotherapist)"; a display name that already names the profession is kept as it is. */
export function clinicianLabel(c: Pick<Clinician, 'displayName' | 'profession'>): string {
  const profession = c.profession.replace(/-/g, ' ');
  return c.displayName.toLowerCase().includes(profession) ? c.displayName : `${c.displayName} (${profession})`;
}

/** An event as the report lists it. */
export function reportIntervention(e: ClinicalEvent): ReportIntervention {
  return { day: e.occurredOn, label: EVENT_KIND_LABELS[e.kind], side: e.side, muscles: e.muscles, dose: e.dose, summary: e.summary };
}

/**
 * Step 4 of referralReport: the interventions (by day, then id) and the visits (by time) in
 * [fromDay, throughDay], and the assessors of those visits, each once.
 */
export function reportVisits(
  liveEvents: readonly ClinicalEvent[],
  assessments: readonly Assessment[],
  clinicians: readonly Pick<Clinician, 'id' | 'displayName' | 'profession'>[],
  window: { readonly fromDay: string; readonly throughDay: string; readonly dayOf: (iso: string) => string },
): { interventions: ReportIntervention[]; visits: ReportVisit[]; assessors: string[] } {
  const inWindow = (day: string) => day >= window.fromDay && day <= window.throughDay;
  const interventions = liveEvents
    .filter((e) => inWindow(e.occurredOn))
    .sort((a, b) => (a.occurredOn < b.occurredOn ? -1 : a.occurredOn > b.occurredOn ? 1 : a.id < b.id ? -1 : 1))
    .map(reportIntervention);
  const clinicianName = new Map(clinicians.map((c) => [c.id, clinicianLabel(c)]));
  const visits: ReportVisit[] = assessments
    .filter((a) => !a.deleted && inWindow(window.dayOf(a.performedAt)))
    .sort((a, b) => (a.performedAt < b.performedAt ? -1 : 1))
    .map((a) => ({ day: window.dayOf(a.performedAt), setting: a.setting, assessor: clinicianName.get(a.assessorId) ?? 'a clinician not known on this device' }));
  return { interventions, visits, assessors: [...new Set(visits.map((v) => v.assessor))] };
}
