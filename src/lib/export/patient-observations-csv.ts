import { findMeasure, findSite, type ClinicalEvent, type Observation } from '../domain';
import { outcomeSeries, type LocalMdc } from '../stats';
import { csvRow } from './csv-cell';
import { localDateTime } from './local-date-time';

/** Header of the per-patient CSV, one row per observation. */
export const PATIENT_CSV_COLUMNS = [
  'patient_code',
  'date',
  'time',
  'taken_at',
  'measure_code',
  'measure',
  'site_code',
  'site',
  'side',
  'mode',
  'instrument',
  'value',
  'unit',
  'grade',
  'grade_rank',
  'r1_deg',
  'r2_deg',
  'quality_grade',
  'baseline_date',
  'change_from_baseline',
  'change_unit',
  'mdc',
  'mdc_source',
  'verdict',
  'event_context',
] as const;

export interface PatientCsvOptions {
  /** IANA time zone for the date and time columns (the device's own, from the page). */
  readonly timeZone: string;
  /** As on the patient page: the team's adopted MDCs and each assessment's examiner. */
  readonly localMdc?: readonly LocalMdc[];
  readonly assessorByAssessment?: ReadonlyMap<string, string>;
}

const dayMs = 86_400_000;

/** "21 days after botulinum-toxin-injection on 2026-03-02", from the latest event on or before the time. */
export function eventContext(takenAtMs: number, events: readonly ClinicalEvent[]): string {
  let best: ClinicalEvent | null = null;
  for (const e of events) {
    if (e.deleted) continue;
    const t = Date.parse(`${e.occurredOn}T00:00:00Z`);
    if (t <= takenAtMs && (best === null || e.occurredOn > best.occurredOn)) best = e;
  }
  if (!best) return '';
  const days = Math.floor((takenAtMs - Date.parse(`${best.occurredOn}T00:00:00Z`)) / dayMs);
  return `${days} day${days === 1 ? '' : 's'} after ${best.kind} on ${best.occurredOn}`;
}

/**
 * One patient's observations as CSV text (RFC 4180, CRLF; the caller adds a BOM if wanted), sorted by
 * time: the local date and time in `timeZone` beside an ISO 8601 instant with its offset; grades as
 * their label with the rank in its own named column (never a bare rank under `value`); and each
 * row's change from the first assessment with the verdict and MDC of the one outcome rule
 * (outcomeSeries, as the patient page shows them). Every text cell goes through csvCell, so a value
 * that starts with = + - @ or a tab is neutralised. Tombstoned observations are left out.
 * Throws RangeError for an unknown time zone.
 */
export function patientObservationsCsv(patientCode: string, observations: readonly Observation[], events: readonly ClinicalEvent[], options: PatientCsvOptions): string {
  const live = observations.filter((o) => !o.deleted);
  const judged = new Map<string, { baselineMs: number | null; change: number | null; mdc: number | null; source: string; verdict: string; changeUnit: string }>();
  for (const s of outcomeSeries(live, { baselineRule: { kind: 'first' }, ...(options.localMdc ? { localMdc: options.localMdc } : {}), ...(options.assessorByAssessment ? { assessorByAssessment: options.assessorByAssessment } : {}) })) {
    const baselineMs = s.baseline ? (s.points[s.baseline.indices[0]!]?.timeMs ?? null) : null;
    s.points.forEach((p, i) => {
      const j = s.judgements[i] ?? null;
      judged.set(p.observationId, {
        baselineMs,
        change: j && Number.isFinite(j.change) ? j.change : null,
        mdc: j?.mdcUsed?.value ?? null,
        source: j ? (j.mdcUsed?.source ?? 'none') : '',
        verdict: j ? j.verdict : s.baseline?.indices.includes(i) ? 'baseline' : '',
        changeUnit: s.ordinalLabels ? 'grade steps' : s.measure.unit,
      });
    });
  }
  const rows = live.slice().sort((a, b) => (a.takenAt < b.takenAt ? -1 : a.takenAt > b.takenAt ? 1 : 0));
  let text = csvRow(PATIENT_CSV_COLUMNS);
  for (const o of rows) {
    const measure = findMeasure(o.measureCode);
    const site = measure ? findSite(measure, o.siteCode) : undefined;
    const v = o.value;
    const value = v.kind === 'ordinal' ? null : v.kind === 'tardieu' ? v.spasticityAngleDeg : v.kind === 'angle' ? v.angleDeg : v.value;
    const unit = v.kind === 'ordinal' ? '' : v.kind === 'tardieu' ? 'deg (R2 − R1)' : measure?.unit === 'deg' ? 'deg' : measure?.unit === '1' ? 'ratio' : (measure?.unit ?? '').replace(/^\{(.*)\}$/, '$1');
    const qualityLabel = v.kind === 'tardieu' && measure?.kind === 'tardieu' ? (measure.qualityGrades.find((g) => g.rank === v.quality)?.label ?? String(v.quality)) : null;
    const when = localDateTime(Date.parse(o.takenAt), options.timeZone);
    const j = judged.get(o.id);
    text += csvRow([
      patientCode,
      when.date,
      when.time,
      when.iso,
      o.measureCode,
      measure?.label ?? '',
      o.siteCode,
      site?.label ?? '',
      o.side,
      o.mode ?? '',
      o.instrument ?? '',
      value,
      unit,
      v.kind === 'ordinal' ? v.grade : '',
      v.kind === 'ordinal' ? v.rank : null,
      v.kind === 'tardieu' ? v.r1Deg : null,
      v.kind === 'tardieu' ? v.r2Deg : null,
      qualityLabel,
      j?.baselineMs != null ? localDateTime(j.baselineMs, options.timeZone).date : '',
      j?.change ?? null,
      j && j.change !== null ? (j.changeUnit === 'deg' ? 'deg' : j.changeUnit.replace(/^\{(.*)\}$/, '$1')) : '',
      j?.mdc ?? null,
      j?.source ?? '',
      j?.verdict ?? '',
      eventContext(Date.parse(o.takenAt), events),
    ]);
  }
  return text;
}
