import type { ClinicalEvent, Observation } from '../domain';
import type { OutcomeOptions } from '../stats';
import type { ReferralReportInput } from './referral-report';
import { ReferralReportError } from './referral-report-error';

const DAY_PATTERN = /^\d{4}-\d{2}-\d{2}$/;

/** Throws ReferralReportError naming `field` unless `value` is a real calendar day YYYY-MM-DD. */
export function checkDay(value: string, field: string): void {
  if (!DAY_PATTERN.test(value) || Number.isNaN(Date.parse(`${value}T00:00:00Z`)) || new Date(`${value}T00:00:00Z`).toISOString().slice(0, 10) !== value) {
    throw new ReferralReportError(`referral report: ${field} "${value}" is not a calendar day (YYYY-MM-DD)`);
  }
}

/** What one report covers, resolved from its scope. */
export interface ResolvedScope {
  readonly fromDay: string;
  readonly throughDay: string;
  /** The event a since-event report is anchored on; null for a period. */
  readonly anchor: ClinicalEvent | null;
  /** The anchor's day at 00:00 UTC (−∞ for a period): a series is shown when assessed at or after it. */
  readonly anchorMs: number;
  /** The live observations the report judges. */
  readonly chosen: readonly Observation[];
  /** outcomeSeries' options: the baseline rule of the scope, the assessors, the team's MDCs. */
  readonly options: OutcomeOptions;
}

/**
 * Step 1 of referralReport: checks the days and the event, and chooses the observations and the
 * baseline rule. Since an event: observations up to `throughDay`, baseline "last before the event"
 * (the same instant as the patient page's "Last before …"); a period: observations whose local day
 * lies in it, baseline the first.
 */
export function reportScope(input: ReferralReportInput, liveEvents: readonly ClinicalEvent[], dayOf: (iso: string) => string): ResolvedScope {
  const { scope } = input;
  const throughDay = scope.throughDay;
  const live = input.observations.filter((o) => !o.deleted);
  const shared = { assessorByAssessment: new Map(input.assessments.map((a) => [a.id, a.assessorId])), ...(input.localMdc ? { localMdc: input.localMdc } : {}) };
  if (scope.kind === 'since-event') {
    const anchor = liveEvents.find((e) => e.id === scope.eventId) ?? null;
    if (!anchor) throw new ReferralReportError(`referral report: scope.eventId "${scope.eventId}" is not an event of this patient`);
    const fromDay = anchor.occurredOn;
    if (throughDay < fromDay) throw new ReferralReportError(`referral report: scope.throughDay ${throughDay} is before the event on ${fromDay}`);
    const anchorMs = Date.parse(`${anchor.occurredOn}T00:00:00Z`);
    return {
      fromDay,
      throughDay,
      anchor,
      anchorMs,
      chosen: live.filter((o) => dayOf(o.takenAt) <= throughDay),
      options: { baselineRule: { kind: 'lastBeforeEvent', eventMs: anchorMs }, ...shared },
    };
  }
  checkDay(scope.fromDay, 'scope.fromDay');
  const fromDay = scope.fromDay;
  if (throughDay < fromDay) throw new ReferralReportError(`referral report: the period ends (${throughDay}) before it starts (${fromDay})`);
  const chosen = live.filter((o) => {
    const day = dayOf(o.takenAt);
    return day >= fromDay && day <= throughDay;
  });
  return { fromDay, throughDay, anchor: null, anchorMs: Number.NEGATIVE_INFINITY, chosen, options: { baselineRule: { kind: 'first' }, ...shared } };
}
