import { EVENT_KIND_LABELS, type Assessment, type ClinicalEvent, type Clinician, type Observation, type Patient } from '../domain';
import { mdcSourceLine, outcomeSeries, type LocalMdc, type MdcProvenance, type OutcomeOptions, type OutcomeSeries, type VerdictKind } from '../stats';
import { localDateTime } from './local-date-time';

const dayMs = 86_400_000;
const DAY_PATTERN = /^\d{4}-\d{2}-\d{2}$/;

/** Refused input of the referral report: names the field and what is wrong with it. */
export class ReferralReportError extends Error {
  override readonly name = 'ReferralReportError';
}

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

function checkDay(value: string, field: string): void {
  if (!DAY_PATTERN.test(value) || Number.isNaN(Date.parse(`${value}T00:00:00Z`)) || new Date(`${value}T00:00:00Z`).toISOString().slice(0, 10) !== value) {
    throw new ReferralReportError(`referral report: ${field} "${value}" is not a calendar day (YYYY-MM-DD)`);
  }
}

function addDays(day: string, days: number): string {
  return new Date(Date.parse(`${day}T00:00:00Z`) + days * dayMs).toISOString().slice(0, 10);
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** A value as the report prints it: the grade label, or the number (≤ 2 decimals) with its unit. */
function valueText(s: OutcomeSeries, value: number): string {
  if (s.ordinalLabels) return s.ordinalLabels[value] ?? String(value);
  // An index keeps two decimals (1.10), as the verdict sentence prints it; angles and scores drop a trailing .0.
  return s.measure.kind === 'index' ? value.toFixed(2) : `${+value.toFixed(1)}${s.unitLabel}`;
}

function signedText(value: number, s: OutcomeSeries): string {
  const decimals = s.measure.kind === 'index' ? 2 : 1;
  const rounded = +value.toFixed(decimals);
  const text = (n: number) => (decimals === 2 ? n.toFixed(2) : String(n));
  // A true minus sign, as printed clinical letters use; "+" on a rise; 0 unsigned.
  return rounded > 0 ? `+${text(rounded)}` : rounded < 0 ? `−${text(-rounded)}` : '0';
}

function changeText(s: OutcomeSeries, range: readonly [number, number]): string {
  const [a, b] = range[0] <= range[1] ? range : [range[1], range[0]];
  const unit = s.ordinalLabels ? (Math.abs(a) === 1 && a === b ? ' grade step' : ' grade steps') : s.unitLabel;
  return a === b ? `${signedText(a, s)}${unit}` : `${signedText(a, s)} to ${signedText(b, s)}${unit}`;
}

function mdcValueText(s: OutcomeSeries, mdc: MdcProvenance | null): string {
  if (!mdc) return 'none';
  const value = +mdc.value.toFixed(2);
  return s.ordinalLabels ? `${value} grade step${value === 1 ? '' : 's'}` : `${value}${s.unitLabel}`;
}

/** The note for an MDC: its full source for a reader who wants to check it, or why there is none. */
function mdcNote(s: OutcomeSeries, mdc: MdcProvenance | null, note: string | null): string {
  if (!mdc) return mdcSourceLine(null, s.unitLabel, s.ordinalLabels !== null, note);
  switch (mdc.source) {
    case 'local':
      return `MDC from your team's own reliability study: ${mdc.citation}.`;
    case 'reference':
      return `MDC from a published figure: ${mdc.citation}.`;
    default:
      return 'MDC of one whole grade step: common practice for ordinal scales; no published MDC exists.';
  }
}

/** "Ada Fenwick (physiotherapist)"; a display name that already names the profession is kept as it is. */
export function clinicianLabel(c: Pick<Clinician, 'displayName' | 'profession'>): string {
  const profession = c.profession.replace(/-/g, ' ');
  return c.displayName.toLowerCase().includes(profession) ? c.displayName : `${c.displayName} (${profession})`;
}

function intervention(e: ClinicalEvent): ReportIntervention {
  return { day: e.occurredOn, label: EVENT_KIND_LABELS[e.kind], side: e.side, muscles: e.muscles, dose: e.dose, summary: e.summary };
}

function percent(share: number): string {
  return `${Math.round(share * 100)} %`;
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
 * Pure: no clock, no storage. Cost O(observations · log observations + events + weeks).
 * Throws ReferralReportError for a day that is not YYYY-MM-DD, a period that ends before it starts,
 * or an event id that is not among the patient's live events; RangeError for an unknown time zone.
 */
export function referralReport(input: ReferralReportInput): ReferralReport {
  const { scope } = input;
  checkDay(scope.throughDay, 'scope.throughDay');
  checkDay(input.preparedOn, 'preparedOn');
  const liveEvents = input.events.filter((e) => !e.deleted);
  const assessorByAssessment = new Map(input.assessments.map((a) => [a.id, a.assessorId]));
  const dayOf = (iso: string) => localDateTime(Date.parse(iso), input.timeZone).date;
  const dayOfMs = (ms: number) => localDateTime(ms, input.timeZone).date;
  const throughDay = scope.throughDay;
  const live = input.observations.filter((o) => !o.deleted);

  let fromDay: string;
  let anchor: ClinicalEvent | null = null;
  let options: OutcomeOptions;
  let chosen: Observation[];
  if (scope.kind === 'since-event') {
    anchor = liveEvents.find((e) => e.id === scope.eventId) ?? null;
    if (!anchor) throw new ReferralReportError(`referral report: scope.eventId "${scope.eventId}" is not an event of this patient`);
    fromDay = anchor.occurredOn;
    if (throughDay < fromDay) throw new ReferralReportError(`referral report: scope.throughDay ${throughDay} is before the event on ${fromDay}`);
    chosen = live.filter((o) => dayOf(o.takenAt) <= throughDay);
    // The same instant as the patient page's "Last before …" baseline.
    options = { baselineRule: { kind: 'lastBeforeEvent', eventMs: Date.parse(`${anchor.occurredOn}T00:00:00Z`) }, assessorByAssessment, ...(input.localMdc ? { localMdc: input.localMdc } : {}) };
  } else {
    checkDay(scope.fromDay, 'scope.fromDay');
    fromDay = scope.fromDay;
    if (throughDay < fromDay) throw new ReferralReportError(`referral report: the period ends (${throughDay}) before it starts (${fromDay})`);
    chosen = live.filter((o) => {
      const day = dayOf(o.takenAt);
      return day >= fromDay && day <= throughDay;
    });
    options = { baselineRule: { kind: 'first' }, assessorByAssessment, ...(input.localMdc ? { localMdc: input.localMdc } : {}) };
  }
  const anchorMs = anchor ? Date.parse(`${anchor.occurredOn}T00:00:00Z`) : Number.NEGATIVE_INFINITY;
  const eventTimesMs = liveEvents.filter((e) => e.occurredOn <= throughDay).map((e) => Date.parse(`${e.occurredOn}T00:00:00Z`));

  const notes: string[] = [];
  const noteNumber = (text: string): number => {
    const at = notes.indexOf(text);
    if (at >= 0) return at + 1;
    notes.push(text);
    return notes.length;
  };
  const measures: ReportMeasure[] = [];
  const notRemeasured: string[] = [];
  for (const s of outcomeSeries(chosen, options)) {
    const after = s.points.some((p) => p.timeMs >= anchorMs);
    if (!after) {
      if (s.baseline) notRemeasured.push(s.title);
      continue;
    }
    // The chart starts at the baseline (or, without one, at the first point after the event).
    const firstShown = s.baseline ? Math.min(...s.baseline.indices) : s.points.findIndex((p) => p.timeMs >= anchorMs);
    const shown = s.points.slice(firstShown);
    const baselineIndices = s.baseline ? s.baseline.indices.map((i) => i - firstShown) : [];
    const v = s.verdict;
    const band = s.baseline && s.mdc && v ? { low: s.baseline.low - s.mdc.value, high: s.baseline.high + s.mdc.value } : null;
    const values = shown.map((p) => p.value);
    const yMin = Math.min(...values, ...(band ? [band.low] : []));
    const yMax = Math.max(...values, ...(band ? [band.high] : []));
    const chart: ReportChart = {
      timesMs: shown.map((p) => p.timeMs),
      values,
      baselineIndices,
      band,
      eventTimesMs: eventTimesMs.filter((t) => t >= shown[0]!.timeMs && t <= shown[shown.length - 1]!.timeMs + dayMs),
      yMin: s.ordinalLabels ? Math.max(0, yMin) : yMin,
      yMax: s.ordinalLabels ? Math.min(s.ordinalLabels.length - 1, yMax) : yMax,
      gradeLabels: s.ordinalLabels,
      unit: s.unitLabel,
    };
    const baselineText = s.baseline
      ? s.baseline.low === s.baseline.high
        ? valueText(s, s.baseline.low)
        : `${valueText(s, s.baseline.low)}–${valueText(s, s.baseline.high)}`
      : null;
    const baselineDays = s.baseline ? s.baseline.indices.map((i) => dayOfMs(s.points[i]!.timeMs)) : [];
    if (v) {
      measures.push({
        key: s.key,
        title: s.title,
        baselineText,
        baselineDays,
        latestText: valueText(s, s.latest.value),
        latestDay: dayOfMs(s.latest.timeMs),
        changeText: changeText(s, v.changeRange),
        mdcText: mdcValueText(s, v.mdcUsed),
        noteNumber: noteNumber(mdcNote(s, v.mdcUsed, s.mdcNote)),
        verdict: v.verdict,
        sentence: v.text,
        chart,
      });
      continue;
    }
    // No verdict: no baseline before the event, or one assessment only in the period.
    const only = s.points.length === 1 || (s.baseline !== null && s.baseline.indices.includes(s.points.length - 1));
    measures.push({
      key: s.key,
      title: s.title,
      // A single assessment is no baseline of anything: it is shown as the latest value only.
      baselineText: only ? null : baselineText,
      baselineDays: only ? [] : baselineDays,
      latestText: valueText(s, s.latest.value),
      latestDay: dayOfMs(s.latest.timeMs),
      // A measure with no better direction still shows its change, unjudged.
      changeText: s.baseline && !only ? changeText(s, [s.latest.value - s.baseline.high, s.latest.value - s.baseline.low]) : '–',
      mdcText: '–',
      noteNumber: null,
      verdict: 'not-compared',
      sentence:
        scope.kind === 'since-event' && !s.baseline
          ? `No assessment before the ${EVENT_KIND_LABELS[anchor!.kind].toLowerCase()} to compare with; latest ${valueText(s, s.latest.value)}.`
          : only
            ? `Assessed once in this period (${valueText(s, s.latest.value)}); nothing to compare with.`
            : 'No direction of improvement for this measure: the change is shown, not judged.',
      chart,
    });
  }

  const tally: Record<ReportVerdict, number> = { improved: 0, 'no-change': 0, worsened: 0, 'no-mdc': 0, 'not-compared': 0 };
  for (const m of measures) tally[m.verdict]++;
  const compared = measures.length - tally['not-compared'];
  const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
  const summaryText =
    measures.length === 0
      ? 'No measure was assessed in this period.'
      : compared === 0
        ? `${plural(measures.length, 'measure was', 'measures were')} assessed, none twice, so no change can be judged.`
        : `Of ${plural(compared, 'measure', 'measures')} compared with baseline, ${tally.improved} improved and ${tally.worsened} got worse beyond measurement error; ${tally['no-change']} did not change beyond it` +
          (tally['no-mdc'] > 0 ? `; for ${tally['no-mdc']} no MDC is known, so the change is shown but not judged` : '') +
          '.';

  const inWindow = (day: string) => day >= fromDay && day <= throughDay;
  const interventions = liveEvents
    .filter((e) => inWindow(e.occurredOn))
    .sort((a, b) => (a.occurredOn < b.occurredOn ? -1 : a.occurredOn > b.occurredOn ? 1 : a.id < b.id ? -1 : 1))
    .map(intervention);

  const clinicianName = new Map(input.clinicians.map((c) => [c.id, clinicianLabel(c)]));
  const visits: ReportVisit[] = input.assessments
    .filter((a) => !a.deleted && inWindow(dayOf(a.performedAt)))
    .sort((a, b) => (a.performedAt < b.performedAt ? -1 : 1))
    .map((a) => ({ day: dayOf(a.performedAt), setting: a.setting, assessor: clinicianName.get(a.assessorId) ?? 'a clinician not known on this device' }));
  const assessors = [...new Set(visits.map((v) => v.assessor))];

  const weeks = input.adherence
    .filter((w) => w.weekStart <= throughDay && addDays(w.weekStart, 6) >= fromDay)
    .sort((a, b) => (a.weekStart < b.weekStart ? -1 : 1))
    .map((w) => ({ weekStart: w.weekStart, planned: w.planned, done: w.done, share: w.planned > 0 ? w.done / w.planned : Number.NaN }));
  let adherence: ReportAdherence | null = null;
  if (weeks.length > 0) {
    const planned = weeks.reduce((sum, w) => sum + w.planned, 0);
    const done = weeks.reduce((sum, w) => sum + w.done, 0);
    const share = planned > 0 ? done / planned : Number.NaN;
    const shares = weeks.filter((w) => w.planned > 0).map((w) => w.share);
    const range = shares.length > 1 ? `; weekly ${percent(Math.min(...shares))} to ${percent(Math.max(...shares))}` : '';
    adherence = {
      weeks,
      planned,
      done,
      share,
      text:
        planned > 0
          ? `${done} of ${planned} planned exercise sessions done in full (${percent(share)}) over ${plural(weeks.length, 'week', 'weeks')}${range}.`
          : `No exercise sessions were planned in these ${plural(weeks.length, 'week', 'weeks')}.`,
    };
  }

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
    anchor: anchor ? intervention(anchor) : null,
    interventions,
    measures,
    notRemeasured,
    tally,
    summaryText,
    visits,
    assessors,
    adherence,
    notes,
    cautions: REPORT_CAUTIONS,
    preparedOn: input.preparedOn,
    preparedBy: input.preparedBy,
    fileName: `kinnote-report-${p.code}-${throughDay}`,
  };
}
