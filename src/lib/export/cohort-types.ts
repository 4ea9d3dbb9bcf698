import type { Assessment, ClinicalEvent, Clinician, EventKind, Observation, Patient } from '../domain';

/** The records a cohort is drawn from, in clear domain form (as the store or a backup bundle holds them). */
export interface CohortRecords {
  readonly patients: readonly Patient[];
  readonly events: readonly ClinicalEvent[];
  readonly assessments: readonly Assessment[];
  readonly observations: readonly Observation[];
  readonly clinicians: readonly Clinician[];
}

export type CohortSetting = Assessment['setting'];
export type CohortCondition = Patient['condition'];
export type CohortSide = Observation['side'];

/**
 * An event that anchors each patient's change: the baseline is the last observation before the
 * event's day, the follow-up the first observation in [event day + windowStartDay, event day +
 * windowEndDay] (e.g. 42–84 for "six to twelve weeks after an injection").
 */
export interface EventAnchor {
  readonly kind: EventKind;
  readonly windowStartDay: number;
  readonly windowEndDay: number;
  /** When set, a baseline older than this many days before the event does not count. */
  readonly baselineMaxDaysBefore?: number | null;
}

/**
 * What the auditor filters on. Every field is optional; an absent or empty field does not filter.
 * Dates are calendar days `YYYY-MM-DD`, inclusive. Without an anchor the date range bounds the
 * observations (baseline = first, follow-up = last in the range); with one it bounds the events.
 */
export interface CohortFilters {
  readonly fromDate?: string | null;
  readonly toDate?: string | null;
  readonly conditions?: readonly CohortCondition[];
  readonly anchor?: EventAnchor | null;
  readonly measureCode?: string | null;
  readonly siteCode?: string | null;
  readonly side?: CohortSide | null;
  readonly settings?: readonly CohortSetting[];
  /** Assessing clinicians (Assessment.assessorId). */
  readonly clinicianIds?: readonly string[];
}

/** A local MDC from the team's own reliability study: one type, the stats engine's (see chooseMdc). */
export type { LocalMdc } from '../stats';
