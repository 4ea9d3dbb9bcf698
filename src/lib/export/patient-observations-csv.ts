import { findMeasure, findSite, type ClinicalEvent, type Observation } from '../domain';
import { csvRow } from './csv-cell';

/** Header of the per-patient CSV, one row per observation. */
export const PATIENT_CSV_COLUMNS = [
  'patient_code',
  'assessment_date',
  'measure_code',
  'measure',
  'site_code',
  'site',
  'side',
  'mode',
  'instrument',
  'value',
  'grade',
  'r1_deg',
  'r2_deg',
  'quality',
  'unit',
  'event_context',
] as const;

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
 * One patient's observations as CSV text (RFC 4180, CRLF, UTF-8 with the caller adding a BOM if
 * wanted), ISO 8601 timestamps, sorted by time. Every text cell goes through csvCell, so a value that
 * starts with = + - @ or a tab is neutralised. Tombstoned observations are left out.
 */
export function patientObservationsCsv(patientCode: string, observations: readonly Observation[], events: readonly ClinicalEvent[]): string {
  const rows = observations.filter((o) => !o.deleted).slice().sort((a, b) => (a.takenAt < b.takenAt ? -1 : a.takenAt > b.takenAt ? 1 : 0));
  let text = csvRow(PATIENT_CSV_COLUMNS);
  for (const o of rows) {
    const measure = findMeasure(o.measureCode);
    const site = measure ? findSite(measure, o.siteCode) : undefined;
    const v = o.value;
    const value =
      v.kind === 'ordinal' ? v.rank : v.kind === 'tardieu' ? v.spasticityAngleDeg : v.kind === 'angle' ? v.angleDeg : v.value;
    text += csvRow([
      patientCode,
      o.takenAt,
      o.measureCode,
      measure?.label ?? '',
      o.siteCode,
      site?.label ?? '',
      o.side,
      o.mode ?? '',
      o.instrument ?? '',
      value,
      v.kind === 'ordinal' ? v.grade : '',
      v.kind === 'tardieu' ? v.r1Deg : null,
      v.kind === 'tardieu' ? v.r2Deg : null,
      v.kind === 'tardieu' ? v.quality : null,
      v.kind === 'ordinal' ? 'grade rank' : (measure?.unit ?? ''),
      eventContext(Date.parse(o.takenAt), events),
    ]);
  }
  return text;
}
