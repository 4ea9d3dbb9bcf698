import { findMeasure, type EventKind } from '$lib/domain';
import type { CohortFilters } from '$lib/export';

/** The cohort page's filter form as state, and the filters it makes. */
export class CohortFilterForm {
  fromDate = $state('');
  toDate = $state('');
  conditions = $state<string[]>([]);
  eventKind = $state<EventKind | ''>('');
  windowStartWeeks = $state(6);
  windowEndWeeks = $state(12);
  measureCode = $state('mas');
  siteCode = $state('');
  side = $state<'' | 'left' | 'right'>('');
  settings = $state<string[]>([]);
  clinicianId = $state('');

  readonly sites = $derived(findMeasure(this.measureCode)?.sites ?? []);
  /** A site belongs to one measure: choosing another measure drops a site it does not have. */
  readonly siteFilter = $derived(this.sites.some((x) => x.code === this.siteCode) ? this.siteCode : '');
  readonly filters = $derived.by(
    (): CohortFilters => ({
      fromDate: this.fromDate || null,
      toDate: this.toDate || null,
      conditions: this.conditions as CohortFilters['conditions'],
      anchor: this.eventKind ? { kind: this.eventKind, windowStartDay: this.windowStartWeeks * 7, windowEndDay: this.windowEndWeeks * 7 } : null,
      measureCode: this.measureCode || null,
      siteCode: this.siteFilter || null,
      side: this.side || null,
      settings: this.settings as CohortFilters['settings'],
      clinicianIds: this.clinicianId ? [this.clinicianId] : [],
    }),
  );
}
