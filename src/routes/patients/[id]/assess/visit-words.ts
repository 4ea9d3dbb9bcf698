import { findMeasure, findSite, type Observation, type VisitTemplate } from '$lib/domain';
import { VISIT_MESSAGES as M, describeValue } from '$lib/ui';

/** Local date-time as the form's date and time fields hold it, e.g. "2026-12-01T09:30". */
export function localNow(): string {
  const offsetMs = new Date().getTimezoneOffset() * 60_000;
  return new Date(Date.now() - offsetMs).toISOString().slice(0, 16);
}

/** "Last time" beside a row: the latest value of its series, with its date; "first visit" when the patient has none earlier. */
export function lastTimeText(o: Observation | undefined, firstVisit = false): string {
  return o ? M.lastTime(describeValue(o.value), new Date(o.takenAt).toLocaleDateString()) : firstVisit ? M.firstVisitNothing : M.noEarlierValue;
}

/** A template's tests in the catalogue's words: "Modified Ashworth: ankle plantarflexors · Tardieu: …". */
export function templateSummary(t: VisitTemplate): string {
  const groups = new Map<string, string[]>();
  for (const test of t.tests) {
    const m = findMeasure(test.measureCode);
    const name = m?.form && m.form.shape !== 'rating' ? m.form.name : M.ratingsGroup;
    const site = m && m.lateral ? (findSite(m, test.siteCode)?.label ?? test.siteCode).toLowerCase() + (test.mode ? ` (${test.mode})` : '') : (m?.label ?? test.measureCode);
    groups.set(name, [...(groups.get(name) ?? []), site]);
  }
  return [...groups].map(([name, sites]) => `${name}: ${sites.join(', ')}`).join(' · ');
}
