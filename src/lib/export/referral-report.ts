import { EVENT_KIND_LABELS, type Assessment, type ClinicalEvent, type Clinician, type Observation, type Patient } from '../domain';
import { outcomeSeries, type LocalMdc, type VerdictKind } from '../stats';
import { localDateTime } from './local-date-time';
import { reportAdherence } from './report-adherence';
import { reportMeasure, type ReportMeasureContext } from './report-measure';
import { checkDay, reportScope } from './report-scope';
import { reportSummary } from './report-summary';
import { reportIntervention, reportVisits } from './report-visits';

export { ReferralReportError } from './referral-report-error';
export { clinicianLabel } from './report-visits';

/**
 * What the report covers: the change since an intervention (baseline: each measure's last assessment
 * before the event day, as the patient page's "Last before …" choice) through a day, or a period
 * (baseline: each measure's first assessment in it).
 */
export type ReportScope =
  | { readonly kind: 'since-event'; readonly eventId: string; readonly throughDay: string }
  | { readonly kind: 'period'; readonly fromDay: string; readonly throughDay: string };

/** One week of home-programme adherence as the record holds it (see the programme's adherenceByWeek). */
export interface ReportAdherenceWeek {
  /** The Monday that starts the week, YYYY-MM-DD. */
  readonly weekStart: string;
  readonly planned: number;
  readonly done: number;
}

export interface ReferralReportInput {
  readonly patient: Pick<Patient, 'code' | 'birthYear' | 'condition' | 'affectedSides'>;
  /** The person's name (and date of birth) when the therapist chose to include it; null keeps the report pseudonymous. */
  readonly identity: { readonly name: string; readonly dateOfBirth: string | null } | null;
  readonly observations: readonly Observation[];
  readonly events: readonly ClinicalEvent[];
  readonly assessments: readonly Assessment[];
  readonly clinicians: readonly Pick<Clinician, 'id' | 'displayName' | 'profession'>[];
  readonly adherence: readonly ReportAdherenceWeek[];
  /** The team's adopted MDCs, as on the patient page. */
  readonly localMdc?: readonly LocalMdc[];
  readonly scope: ReportScope;
  /** IANA time zone in which assessment times become calendar days (the device's own). */
  readonly timeZone: string;
  /** The day the report is prepared (the caller reads the clock), YYYY-MM-DD. */
  readonly preparedOn: string;
  /** Who prepares it, e.g. "Robin Testwell (physiotherapist)"; null when unknown. */
  readonly preparedBy: string | null;
}

export interface ReportIntervention {
  readonly day: string;
  readonly label: string;
  /** "left", "right", "both" or null. */
  readonly side: string | null;
  readonly muscles: string | null;
  readonly dose: string | null;
  readonly summary: string;
}

/** Small chart of one measure: the points shown, the band of change within the MDC, the events. */
export interface ReportChart {
  readonly timesMs: readonly number[];
  readonly values: readonly number[];
  /** Which of the points are the baseline. */
  readonly baselineIndices: readonly number[];
  /** Baseline ± MDC: changes inside it are within measurement error; null without baseline or MDC. */
  readonly band: { readonly low: number; readonly high: number } | null;
  readonly eventTimesMs: readonly number[];
  readonly yMin: number;
  readonly yMax: number;
  /** Grade labels by rank for an ordinal scale; null for continuous values. */
  readonly gradeLabels: readonly string[] | null;
  readonly unit: string;
}

export type ReportVerdict = VerdictKind | 'not-compared';

export interface ReportMeasure {
  readonly key: string;
  readonly title: string;
  /** e.g. "3" or "110°"; a two-grade baseline as "2–3"; null with no assessment before the event. */
  readonly baselineText: string | null;
  readonly baselineDays: readonly string[];
  readonly latestText: string | null;
  readonly latestDay: string | null;
  /** e.g. "−2 grade steps", "+15°"; "–" when not compared. */
  readonly changeText: string;
  /** e.g. "1 grade step", "10°", "none"; "–" when not compared. */
  readonly mdcText: string;
  /** 1-based number of the row's note in `notes` (where the MDC comes from); null when not compared. */
  readonly noteNumber: number | null;
  readonly verdict: ReportVerdict;
  /** The one verdict sentence of the outcome rule, or why there is no comparison. */
  readonly sentence: string;
  readonly chart: ReportChart;
}

export interface ReportAdherence {
  readonly weeks: readonly (ReportAdherenceWeek & { readonly share: number })[];
  readonly planned: number;
  readonly done: number;
  /** done / planned; NaN when nothing was planned. */
  readonly share: number;
  readonly text: string;
}

export interface ReportVisit {
  readonly day: string;
  readonly setting: string;
  readonly assessor: string;
}

export interface ReferralReport {
  readonly patientCode: string;
  readonly identity: { readonly name: string; readonly dateOfBirth: string | null } | null;
  /** e.g. "Stroke · born 1961 · affected side: left". */
  readonly patientFacts: string;
  /** First and last calendar day the report covers (interventions, visits, adherence). */
  readonly fromDay: string;
  readonly throughDay: string;
  /** One sentence saying what is compared with what. */
  readonly scopeText: string;
  readonly anchor: ReportIntervention | null;
  readonly interventions: readonly ReportIntervention[];
  readonly measures: readonly ReportMeasure[];
  /** Series with a baseline before the event but no assessment after it. */
  readonly notRemeasured: readonly string[];
  readonly tally: Readonly<Record<ReportVerdict, number>>;
  readonly summaryText: string;
  readonly visits: readonly ReportVisit[];
  readonly assessors: readonly string[];
  readonly adherence: ReportAdherence | null;
  /** Numbered notes: where each MDC comes from (full citation), or why there is none. */
  readonly notes: readonly string[];
  readonly cautions: readonly string[];
  readonly preparedOn: string;
  readonly preparedBy: string | null;
  /** Suggested file name without extension, e.g. "kinnote-report-K7QM-3XHD-2026-04-30". */
  readonly fileName: string;
}

/** The cautions every report carries (the project brief's wording, and what a change means). */
export const REPORT_CAUTIONS: readonly string[] = [
  'Kinnote is not a diagnostic device. These figures support clinical judgement; decisions rest with licensed clinicians.',
  'Follow your local protocols and data-protection law when you send, store or file this report: it holds health data.',
  'A change counts only when it reaches the MDC (minimal detectable change at 95 % confidence); a smaller change may be measurement error. Grades are never averaged.',
  'Readings taken in another position, at another time after medication or by another rater may not be comparable.',
];

/**
 * The event a report covers by default: the latest botulinum toxin injection, else the latest event;
 * null when the patient has none (then the report covers a period). Tombstones ignored.
 */
export function defaultReportEvent<E extends Pick<ClinicalEvent, 'id' | 'kind' | 'occurredOn' | 'deleted'>>(events: readonly E[]): E | null {
  const byDate = events.filter((e) => !e.deleted).sort((a, b) => (a.occurredOn < b.occurredOn ? 1 : a.occurredOn > b.occurredOn ? -1 : 0));
  return byDate.find((e) => e.kind === 'botulinum-toxin-injection') ?? byDate[0] ?? null;
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/**
 * The report a referring clinician receives after a follow-up, as plain data for one or two printed
 * A4 pages: who and when, the interventions, each measure's baseline and latest value with the change,
 * the MDC and its source and the one verdict sentence (all from outcomeSeries, i.e. chooseMdc: the same
 * rule as the patient page, the cohort and every CSV, with the patient page's options), a small chart's
 * data per measure, home-programme adherence and the cautions.
 * Since an event: observations up to `throughDay` are judged with the baseline "last before the event"
 * (the patient page's choice of the same name, so the verdicts agree); a measure appears when it was
 * assessed on or after the event day. A period: observations whose local day lies in it, baseline the
 * first. Interventions, visits and adherence weeks are those that touch [fromDay, throughDay].
 * Steps, one file each: the scope (report-scope), one row per series (report-measure), the tally and
 * summary (report-summary), interventions and visits (report-visits), adherence (report-adherence).
 * Pure: no clock, no storage. Cost O(observations · log observations + events + weeks).
 * Throws ReferralReportError for a day that is not YYYY-MM-DD, a period that ends before it starts,
 * or an event id that is not among the patient's live events; RangeError for an unknown time zone.
 *
 * @example
 * const report = referralReport({
 *   patient, identity: null, observations, events, assessments, clinicians, adherence: [],
 *   scope: { kind: 'since-event', eventId: injection.id, throughDay: '2026-04-30' },
 *   timeZone: 'Europe/Berlin', preparedOn: '2026-04-30', preparedBy: null,
 * });
 * report.measures.map((m) => m.sentence); // one verdict sentence per measure, as on the patient page
 * report.fileName; // "kinnote-report-K7QM-3XHD-2026-04-30"
 */
export function referralReport(input: ReferralReportInput): ReferralReport {
  checkDay(input.scope.throughDay, 'scope.throughDay');
  checkDay(input.preparedOn, 'preparedOn');
  const liveEvents = input.events.filter((e) => !e.deleted);
  const dayOf = (iso: string) => localDateTime(Date.parse(iso), input.timeZone).date;
  const { fromDay, throughDay, anchor, anchorMs, chosen, options } = reportScope(input, liveEvents, dayOf);

  const notes: string[] = [];
  const context: ReportMeasureContext = {
    scopeKind: input.scope.kind,
    anchor,
    anchorMs,
    eventTimesMs: liveEvents.filter((e) => e.occurredOn <= throughDay).map((e) => Date.parse(`${e.occurredOn}T00:00:00Z`)),
    dayOfMs: (ms) => localDateTime(ms, input.timeZone).date,
    noteNumber: (text) => {
      const at = notes.indexOf(text);
      if (at >= 0) return at + 1;
      notes.push(text);
      return notes.length;
    },
  };
  const measures: ReportMeasure[] = [];
  const notRemeasured: string[] = [];
  for (const s of outcomeSeries(chosen, options)) {
    const measure = reportMeasure(s, context);
    if (measure) measures.push(measure);
    else if (s.baseline) notRemeasured.push(s.title);
  }
  const { tally, summaryText } = reportSummary(measures);
  const { interventions, visits, assessors } = reportVisits(liveEvents, input.assessments, input.clinicians, { fromDay, throughDay, dayOf });

  const p = input.patient;
  const sides = p.affectedSides.length > 0 ? `affected side: ${p.affectedSides.join(' and ')}` : 'affected side not recorded';
  const scopeText = anchor
    ? `Change since the ${EVENT_KIND_LABELS[anchor.kind].toLowerCase()} on ${anchor.occurredOn}, through ${throughDay}: each measure's last assessment before that day against its latest assessment.`
    : `Change within ${fromDay} to ${throughDay}: each measure's first assessment in the period against its latest.`;
  return {
    patientCode: p.code,
    identity: input.identity,
    patientFacts: `${capitalise(p.condition.replace(/-/g, ' '))} · born ${p.birthYear} · ${sides}`,
    fromDay,
    throughDay,
    scopeText,
    anchor: anchor ? reportIntervention(anchor) : null,
    interventions,
    measures,
    notRemeasured,
    tally,
    summaryText,
    visits,
    assessors,
    adherence: reportAdherence(input.adherence, fromDay, throughDay),
    notes,
    cautions: REPORT_CAUTIONS,
    preparedOn: input.preparedOn,
    preparedBy: input.preparedBy,
    fileName: `kinnote-report-${p.code}-${throughDay}`,
  };
}
